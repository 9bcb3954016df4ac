import "server-only";
import { z } from "zod";

/** Server environment, parsed once. See .env.example for what each variable means. */
const serverEnvSchema = z.object({
  DATABASE_URL: z.string().url({ message: "DATABASE_URL must be a postgres:// URL" }),
  NEXTAUTH_SECRET: z.string().min(16, "NEXTAUTH_SECRET must be at least 16 characters"),
  NEXTAUTH_URL: z.string().url().optional(),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  SMTP_URL: z.string().default("smtp://127.0.0.1:1025"),
  MAIL_FROM: z.string().default("Tareline <no-reply@tareline.invalid>"),
});
export type ServerEnv = z.infer<typeof serverEnvSchema>;

let cached: ServerEnv | undefined;

export function serverEnv(): ServerEnv {
  if (!cached) {
    const parsed = serverEnvSchema.safeParse(process.env);
    if (!parsed.success) {
      const fields = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
      throw new Error(`Server configuration is incomplete (${fields}). Run npm start, or see .env.example.`);
    }
    cached = parsed.data;
  }
  return cached;
}
