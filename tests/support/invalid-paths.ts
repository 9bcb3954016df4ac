import { AppError } from "@/lib/errors/app-error";

/** Runs `fn`, expects an invalid_input AppError, and returns the dotted paths it names. */
export function invalidPaths(fn: () => unknown): string[] {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError && e.code === "invalid_input") return e.issues.map((i) => i.path);
    throw e;
  }
  throw new Error("expected an invalid_input AppError");
}
