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
