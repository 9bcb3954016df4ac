/** Shared by the members forms and their route handlers. */
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
