/**
 * The members domain's zod schemas (memberships, invitations, accounts), shared by the
 * forms (zodResolver) and the operations in lib/members/server/.
 */
import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import { safeString, text } from "@/lib/schemas/text";

/** The longest e-mail address accepted (RFC 5321 limits a path to 256 octets; the column holds 320). */
export const MAX_EMAIL_LENGTH = 254;

/** An e-mail address as typed: trimmed, lower-cased, bounded, then checked. */
export const emailSchema = text(MAX_EMAIL_LENGTH)
  .toLowerCase()
  .pipe(z.email({ message: "Enter a valid e-mail address" }));

export const roleSchema = z.enum(ROLES, { message: "Choose one of the lab's roles" });

export const membershipSchema = z.object({
  id: z.uuid(),
  userId: z.uuid(),
  email: z.email(),
  name: z.string(),
  role: roleSchema,
  joinedAt: z.string(),
});
export type MembershipRow = z.infer<typeof membershipSchema>;

export const inviteMemberSchema = z.object({
  email: emailSchema,
  role: roleSchema,
});
export type InviteMemberInput = z.input<typeof inviteMemberSchema>;

export const changeRoleSchema = membershipSchema.pick({ role: true });

export const signInSchema = z.object({
  email: emailSchema,
  password: safeString(1000).min(1, "Enter your password"),
});
export type SignInInput = z.input<typeof signInSchema>;

export const passwordSchema = safeString(200).min(10, "Use at least 10 characters");

export const changePasswordSchema = z
  .object({
    currentPassword: safeString(1000).min(1, "Enter your current password"),
    newPassword: passwordSchema,
    confirmPassword: safeString(1000),
  })
  .refine((v) => v.newPassword === v.confirmPassword, { path: ["confirmPassword"], message: "The two new passwords differ" });
export type ChangePasswordInput = z.input<typeof changePasswordSchema>;

export const acceptInvitationSchema = z
  .object({
    name: text(200).min(1, "Enter your name"),
    password: passwordSchema,
    confirmPassword: safeString(1000),
  })
  .refine((v) => v.password === v.confirmPassword, { path: ["confirmPassword"], message: "The two passwords differ" });
export type AcceptInvitationInput = z.input<typeof acceptInvitationSchema>;
