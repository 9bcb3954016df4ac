import "server-only";
import { notFound, redirect } from "next/navigation";
import { AppError } from "@/lib/errors/app-error";
import { requireLabAccess } from "@/lib/auth/access";
import type { Permission } from "@/lib/auth/permissions";

/**
 * For pages: the same check as route handlers, turned into navigation — no session
 * goes to sign-in, another lab's or a forbidden page is a 404 (nothing is revealed).
 */
export async function pageLabAccess(labSlug: string, permission?: Permission) {
  try {
    return await requireLabAccess(labSlug, permission);
  } catch (e) {
    if (e instanceof AppError && e.code === "unauthenticated") redirect("/signin");
    if (e instanceof AppError && (e.code === "not_found" || e.code === "forbidden")) notFound();
    throw e;
  }
}

/**
 * A page's read of one record: the record, or Next's 404 page when the lab has no such record
 * (AppError not_found: another lab's, or none). Other errors pass on.
 * Example: const { study } = await orNotFound(getStudy({ labId, studyId }));
 */
export async function orNotFound<T>(read: Promise<T>): Promise<T> {
  try {
    return await read;
  } catch (e) {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  }
}
