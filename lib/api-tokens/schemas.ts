/** The API token schemas, shared by the create form and the route handlers. */
import { z } from "zod";
import { roleSchema } from "@/lib/members/schemas";
import { text } from "@/lib/schemas/text";
import type { Role } from "@/lib/auth/roles";
import { TOKEN_LIFETIME_DAYS, type TokenState } from "./rules";

/** Lifetimes the form offers, in days (any whole number in range is accepted by the API). */
export const TOKEN_LIFETIME_CHOICES = [7, 30, 90, 180, 365] as const;

export const createApiTokenSchema = z.object({
  name: text(80)
    .min(1, "give the token a name, e.g. the script that will use it")
    // NUL and broken characters are refused by text(); other control characters here.
    .refine((s) => !/[\u0001-\u001f\u007f-\u009f]/.test(s), "no control characters"),
  role: roleSchema,
  expiresInDays: z
    .number({ message: `a whole number of days, ${TOKEN_LIFETIME_DAYS.min} to ${TOKEN_LIFETIME_DAYS.max}` })
    .int("a whole number of days")
    .min(TOKEN_LIFETIME_DAYS.min, `at least ${TOKEN_LIFETIME_DAYS.min} day`)
    .max(TOKEN_LIFETIME_DAYS.max, `at most ${TOKEN_LIFETIME_DAYS.max} days`),
});
export type CreateApiTokenInput = z.input<typeof createApiTokenSchema>;

/** A token as lists show it: never its secret, only its selector. */
export interface ApiTokenRow {
  id: string;
  name: string;
  role: Role;
  /** The secret's first characters, e.g. "trl_Ab3dE9xQ", to recognise it. */
  selector: string;
  createdBy: string;
  createdAt: string;
  expiresAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  state: TokenState;
}

/** What creating a token returns: the row, and the secret, shown this once. */
export interface CreatedApiToken {
  token: ApiTokenRow;
  secret: string;
}
