import { pageLabAccess } from "@/lib/auth/page-access";
import { listApiTokens } from "@/lib/api-tokens/server/list-api-tokens";
import { grantableTokenRoles } from "@/lib/api-tokens/rules";
import { serverEnv } from "@/lib/server/env";
import { ApiTokensClient } from "@/components/api-tokens/api-tokens-client";

export const metadata = { title: "API tokens" };

export default async function ApiTokensPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "tokens.manage");
  const tokens = await listApiTokens({ labId: access.lab.id });
  return (
    <div className="flex flex-col gap-5">
      <div>
        <p className="text-sm uppercase tracking-wide text-ink-faint">Lab settings</p>
        <h1>API tokens</h1>
        <p className="mt-1 max-w-3xl text-sm text-ink-soft">
          Tokens let the lab&apos;s scripts and pipelines use the HTTP API of {access.lab.name} without a password: send{" "}
          <code className="rounded bg-paper-deep px-1 font-mono text-xs">Authorization: Bearer trl_…</code> with each request. A token has one of the lab&apos;s roles and acts for the person who
          created it; every change it makes is recorded in the audit log under its name. Only a fingerprint of each token is stored, so a token is shown once, when it is created.
        </p>
      </div>
      <ApiTokensClient labSlug={access.lab.slug} appUrl={serverEnv().APP_URL} roles={grantableTokenRoles(access.role)} initial={tokens} />
    </div>
  );
}
