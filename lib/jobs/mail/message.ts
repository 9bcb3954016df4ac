import { z } from "zod";

/**
 * An e-mail as it is queued. Attachments travel inside the job, so they must stay small
 * (at most MAX_INLINE_ATTACHMENT_BYTES together); anything larger, such as a release sheet
 * as PDF, is produced in the worker by a registered renderer (lib/jobs/mail/renderers.ts).
 */
export const MAX_INLINE_ATTACHMENT_BYTES = 256 * 1024;

const base64 = /^[A-Za-z0-9+/]*={0,2}$/;
const decodedBytes = (b64: string) => Math.floor((b64.length * 3) / 4) - (b64.endsWith("==") ? 2 : b64.endsWith("=") ? 1 : 0);

export const mailAttachmentSchema = z.object({
  filename: z.string().min(1).max(200).regex(/^[^/\\\0\r\n]+$/, "A file name without slashes or line breaks"),
  contentType: z.string().regex(/^[\w.+-]+\/[\w.+-]+$/, "A MIME type such as application/pdf"),
  contentBase64: z.string().max(Math.ceil(MAX_INLINE_ATTACHMENT_BYTES / 3) * 4).regex(base64, "Base64 content"),
});
export type MailAttachment = z.infer<typeof mailAttachmentSchema>;

/** The content of a message: a queued message without its recipient (a renderer's output: renderedContentSchema below). */
export const mailContentSchema = z.object({
  subject: z.string().min(1).max(300).regex(/^[^\r\n]*$/, "One line"),
  text: z.string().min(1).max(200_000),
  html: z.string().max(500_000).optional(),
  attachments: z
    .array(mailAttachmentSchema)
    .max(10)
    .default([])
    .refine((list) => list.reduce((sum, a) => sum + decodedBytes(a.contentBase64), 0) <= MAX_INLINE_ATTACHMENT_BYTES, {
      message: `Inline attachments may hold ${MAX_INLINE_ATTACHMENT_BYTES / 1024} KiB together; render larger ones in the worker`,
    }),
});
export type MailContent = z.output<typeof mailContentSchema>;
export type MailContentInput = z.input<typeof mailContentSchema>;

/**
 * What a renderer builds in the worker travels in no job, so its attachments may be larger
 * than inline ones (a 96-vial prep sheet PDF is about 180 KB, its worklist CSV 80 KB): up to
 * 10 MiB together, under what mail servers commonly accept.
 */
export const MAX_RENDERED_ATTACHMENT_BYTES = 10 * 1024 * 1024;
const renderedAttachmentSchema = mailAttachmentSchema.extend({
  contentBase64: z.string().max(Math.ceil(MAX_RENDERED_ATTACHMENT_BYTES / 3) * 4).regex(base64, "Base64 content"),
});

/** The content a registered renderer returns (checked in the worker before sending). */
export const renderedContentSchema = mailContentSchema.extend({
  attachments: z
    .array(renderedAttachmentSchema)
    .max(10)
    .default([])
    .refine((list) => list.reduce((sum, a) => sum + decodedBytes(a.contentBase64), 0) <= MAX_RENDERED_ATTACHMENT_BYTES, {
      message: `A rendered message's attachments may hold ${MAX_RENDERED_ATTACHMENT_BYTES / 1024 / 1024} MiB together`,
    }),
});

export const mailMessageSchema = mailContentSchema.extend({ to: z.email() });
export type MailMessage = z.output<typeof mailMessageSchema>;
export type MailMessageInput = z.input<typeof mailMessageSchema>;
