import Link from "next/link";
import { describeInvitation } from "@/lib/members/server/accept-invitation";
import { AppError } from "@/lib/errors/app-error";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { AcceptInvitationForm } from "@/components/auth/accept-invitation-form";
import { Banner } from "@/components/ui/banner";

export const metadata = { title: "Join a lab" };
export const dynamic = "force-dynamic";

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let invitation: Awaited<ReturnType<typeof describeInvitation>>;
  try {
    invitation = await describeInvitation(token);
  } catch (e) {
    if (e instanceof AppError && e.code === "not_found") {
      return (
        <>
          <h1 className="mb-3">Invitation not valid</h1>
          <Banner tone="caution">{e.message}</Banner>
          <p className="mt-4 text-sm"><Link href="/signin">Go to sign-in</Link></p>
        </>
      );
    }
    throw e;
  }
  return (
    <>
      <h1 className="mb-1">Join {invitation.labName}</h1>
      <p className="mb-5 text-sm text-ink-faint">
        As {ROLE_LABELS[invitation.role].toLowerCase()}, signing in as <span className="font-medium text-ink-soft">{invitation.email}</span>.
      </p>
      <AcceptInvitationForm token={token} email={invitation.email} />
    </>
  );
}
