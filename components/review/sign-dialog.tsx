"use client";

/**
 * The e-signature of a review (issue 11): the decision (approve, request changes,
 * reject), what the signature will mean — shown before signing —, the content hash being
 * signed, a comment and the reviewer's own password entered again. Checked with the same
 * schema as the route (lib/plans/review-schemas.ts); the server's answer (a wrong password
 * names `password`) is shown on the field.
 */
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { postJson } from "@/lib/client/fetch-json";
import { planReviewSchema, type PlanReviewInput } from "@/lib/plans/review-schemas";
import { DECISION_LABELS, REVIEW_DECISIONS, SIGNATURE_MEANINGS, type ReviewDecision } from "@/lib/plans/signature";
import type { PlanView } from "@/lib/plans/view";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";

const HINT: Record<ReviewDecision, string> = {
  approve: "The plan may be released as it is. Any later edit voids this signature.",
  request_changes: "The author edits the plan and submits it again; say what must change.",
  reject: "The plan cannot go ahead; say why.",
};

/**
 * `signable` is false once the plan no longer waits for review (or the viewer wrote it):
 * the dialog then shows only what the last signing said, which is why the page renders it
 * in the same place either way (its message survives the page's refresh after signing).
 */
export function SignDialog({ labSlug, plan, blocked, signable }: { labSlug: string; plan: Pick<PlanView, "id" | "contentHash" | "name" | "version">; blocked: boolean; signable: boolean }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, watch, formState, setError, reset } = useForm<PlanReviewInput>({
    resolver: zodResolver(planReviewSchema),
    defaultValues: { decision: blocked ? "request_changes" : "approve", comment: "", password: "" },
  });
  const decision = (watch("decision") ?? "approve") as ReviewDecision;

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson<{ plan: PlanView }>(`/api/labs/${labSlug}/plans/${plan.id}/review`, values);
    if (!res.ok) {
      for (const i of res.error.issues) if (i.path === "password" || i.path === "comment" || i.path === "decision") setError(i.path, { message: i.message });
      setMessage({ tone: "blocks", text: res.error.message });
      return;
    }
    reset({ decision: values.decision, comment: "", password: "" });
    setMessage({ tone: "ok", text: `Signed: ${SIGNATURE_MEANINGS[values.decision as ReviewDecision]}. The author has been e-mailed.` });
    setOpen(false);
    router.refresh();
  });

  if (!signable) {
    return message ? (
      <Banner tone={message.tone} testId="sign-result">
        {message.text}
      </Banner>
    ) : null;
  }
  if (!open) {
    return (
      <div className="flex flex-col gap-2">
        {message && (
          <Banner tone={message.tone} testId="sign-result">
            {message.text}
          </Banner>
        )}
        <Button type="button" onClick={() => setOpen(true)} data-testid="open-sign-dialog">
          Sign the review…
        </Button>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4 rounded-lg border border-accent/40 bg-paper-card p-4" noValidate aria-label="Sign the review" data-testid="sign-dialog">
      <h2 className="text-base">Sign the review of “{plan.name}”</h2>
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 text-sm font-medium text-ink-soft">Decision</legend>
        {REVIEW_DECISIONS.map((d) => (
          <label key={d} className={`flex items-center gap-2 text-sm ${d === "approve" && blocked ? "text-ink-faint" : ""}`}>
            <input type="radio" value={d} {...register("decision")} disabled={d === "approve" && blocked} data-testid={`decision-${d}`} />
            {DECISION_LABELS[d]}
          </label>
        ))}
        {blocked && <p className="text-xs text-blocks">A caution blocks: this plan cannot be approved as it is.</p>}
      </fieldset>
      <div className="rounded-md border border-ink-line bg-paper px-3 py-2 text-sm" data-testid="sign-meaning">
        <p>
          Your signature will mean: <strong>{SIGNATURE_MEANINGS[decision]}</strong>.
        </p>
        <p className="text-xs text-ink-soft">{HINT[decision]}</p>
        <p className="mt-1 text-xs text-ink-faint">
          It binds to the plan as it is now (version <span className="num">{plan.version}</span>), SHA-256 <span className="break-all font-mono">{plan.contentHash}</span>.
        </p>
      </div>
      <Field label={decision === "approve" ? "Comment (optional)" : "Comment"} htmlFor="comment" error={formState.errors.comment?.message}>
        <textarea id="comment" rows={3} className={inputClass} {...register("comment")} />
      </Field>
      <Field label="Your password" htmlFor="password" error={formState.errors.password?.message} hint="Enter it again to sign; it is checked like a sign-in.">
        <input id="password" type="password" autoComplete="current-password" className={inputClass} {...register("password")} />
      </Field>
      {message && (
        <Banner tone={message.tone} testId="sign-result">
          {message.text}
        </Banner>
      )}
      <div className="flex gap-2">
        <Button type="submit" disabled={formState.isSubmitting} data-testid="sign-submit">
          {formState.isSubmitting ? "Signing…" : `Sign: ${DECISION_LABELS[decision].toLowerCase()}`}
        </Button>
        <Button type="button" variant="secondary" onClick={() => setOpen(false)}>
          Not now
        </Button>
      </div>
    </form>
  );
}
