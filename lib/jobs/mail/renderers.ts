import { invitationMail } from "@/lib/members/invitation-mail";
import { planReleasedMail } from "@/lib/plans/release-mail";
import type { MailRenderer } from "./renderer";

/**
 * The registered mail renderers, by the name a queued mail gives (`{ render: "invitation" }`).
 * A feature that mails something built at send time (a plan notification, a release
 * sheet with its PDF) adds its renderer here.
 */
export const MAIL_RENDERERS = {
  invitation: invitationMail,
  "plan-released": planReleasedMail,
} satisfies Record<string, MailRenderer>;

export type MailRendererName = keyof typeof MAIL_RENDERERS;
export const MAIL_RENDERER_NAMES = Object.keys(MAIL_RENDERERS) as [MailRendererName, ...MailRendererName[]];
