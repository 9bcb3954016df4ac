/**
 * The members domain's zod schemas (memberships, invitations, accounts), shared by the
 * forms (zodResolver) and the operations in lib/members/server/.
 */
import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";

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
  email: z.email({ message: "Enter a valid e-mail address" }).transform((e) => e.trim().toLowerCase()),
  role: roleSchema,
});
export type InviteMemberInput = z.input<typeof inviteMemberSchema>;

export const changeRoleSchema = membershipSchema.pick({ role: true });

export const signInSchema = z.object({
  email: z
    .string()
    .trim()
    .toLowerCase()
    .pipe(z.email({ message: "Enter a valid e-mail address" })),
  password: z.string().min(1, "Enter your password"),
});
export type SignInInput = z.input<typeof signInSchema>;

export const passwordSchema = z
  .string()
  .min(10, "Use at least 10 characters")
  .max(200, "Use at most 200 characters");

export const changePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, "Enter your current password"),
    newPassword: passwordSchema,
    confirmPassword: z.string(),
  })
  .refine((v) => v.newPassword === v.confirmPassword, { path: ["confirmPassword"], message: "The two new passwords differ" });
export type ChangePasswordInput = z.input<typeof changePasswordSchema>;

export const acceptInvitationSchema = z
  .object({
    name: z.string().trim().min(1, "Enter your name").max(200),
    password: passwordSchema,
    confirmPassword: z.string(),
  })
  .refine((v) => v.password === v.confirmPassword, { path: ["confirmPassword"], message: "The two passwords differ" });
export type AcceptInvitationInput = z.input<typeof acceptInvitationSchema>;
