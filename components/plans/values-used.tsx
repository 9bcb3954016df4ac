/**
 * The values a plan's run sheet and cautions are computed with (`computedWith` of the plan
 * and of the preview): the vessel type and where its rating comes from, the block and its
 * temperature limits, the dispensing limits and the hazard thresholds — all from the lab's
 * settings, read-only wherever a plan is shown, with a link to where they are set.
 */
import type { ReactNode } from "react";
import type { PlanComputedWith } from "@/lib/plans/view";
import { significant } from "./format";

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex justify-between gap-3 border-b border-ink-line/60 py-1 last:border-0">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="num text-right">{children}</dd>
    </div>
  );
}

function Group({ title, children, testId }: { title: string; children: ReactNode; testId?: string }) {
  return (
    <section className="rounded-lg border border-ink-line bg-paper-card px-3 py-2" data-testid={testId}>
      <h3 className="mb-1 text-sm font-semibold">{title}</h3>
      <dl className="text-sm">{children}</dl>
    </section>
  );
}

const v = (x: number, unit: string) => `${significant(x, 4)} ${unit}`;

export function ValuesUsed({ computedWith, settingsHref, issues = [], testId = "values-used" }: { computedWith: PlanComputedWith; settingsHref?: string; issues?: readonly string[]; testId?: string }) {
  const { vessel, block, equipment, dispensing: d, thresholds: t } = computedWith;
  return (
    <div className="@container flex flex-col gap-3" data-testid={testId}>
      <p className="text-sm text-ink-soft">
        The plan is computed with these values. They come from the lab&apos;s settings
        {settingsHref ? (
          <>
            {" "}
            (<a href={settingsHref}>Lab settings</a>: lab admins set the equipment and dispensing limits, safety officers the hazard thresholds)
          </>
        ) : null}
        ; the editor does not change them.
      </p>
      {issues.length > 0 && (
        <ul className="rounded-md border border-blocks/30 bg-blocks-bg px-3 py-2 text-sm text-blocks" data-testid={`${testId}-issues`}>
          {issues.map((m) => (
            <li key={m}>{m}</li>
          ))}
        </ul>
      )}
      <div className="grid gap-3 @2xl:grid-cols-2">
        <Group title="Vessel" testId={`${testId}-vessel`}>
          {typeof vessel === "string" ? (
            <Row label="Type">{vessel}</Row>
          ) : (
            <>
              <Row label="Type">
                <span className="font-sans">{vessel.name}</span>
              </Row>
              <Row label="Total volume">{v(vessel.totalVolumeMl, "mL")}</Row>
              <Row label="Working range">
                {significant(vessel.workingMinMl, 4)}–{v(vessel.workingMaxMl, "mL")}
              </Row>
              <Row label="Maximum fill">{v(vessel.maxFillFraction * 100, "%")}</Row>
              <Row label="Rated pressure">{v(vessel.ratedBar, "bar")} absolute</Row>
              <Row label="Sealed">{vessel.sealed ? "yes" : "no (vented)"}</Row>
              {vessel.confirmWithSupplier && <Row label="Rating">confirm with the supplier</Row>}
              {vessel.source && <p className="pt-1 text-xs text-ink-faint">Rating: {vessel.source}</p>}
            </>
          )}
        </Group>
        <Group title="Block and temperature limits" testId={`${testId}-block`}>
          {block ? (
            <>
              <Row label="Block">
                <span className="font-sans">{block.name}</span>
              </Row>
              <Row label="Positions">{block.positions}</Row>
            </>
          ) : (
            <Row label="Block">none named</Row>
          )}
          <Row label="Highest set point">{v(equipment.blockMaxC, "°C")}</Row>
          <Row label="Lowest (cooling)">{v(equipment.coolingMinC, "°C")}</Row>
        </Group>
        <Group title="Dispensing limits" testId={`${testId}-dispensing`}>
          <Row label="Smallest pipetted volume">{v(d.minPipetteVolumeUl, "µL")}</Row>
          <Row label="Smallest weighed mass">{v(d.minWeighMassMg, "mg")}</Row>
          <Row label="Overage on stocks">{v(d.overagePercent, "%")}</Row>
          <Row label="Dead volume per stock">{v(d.deadVolumeUl, "µL")}</Row>
          <Row label="Largest stock">{v(d.maxStockVolumeMl, "mL")}</Row>
          <Row label="Stock share of each solvent">{v(d.stockFillFraction * 100, "%")}</Row>
        </Group>
        <Group title="Hazard thresholds" testId={`${testId}-thresholds`}>
          <Row label="Pressure allowed">{v(t.safetyFactor * 100, "%")} of the rating</Row>
          <Row label="Sign-off at or above">{v(t.signOffTemperatureC, "°C")}</Row>
          <Row label="Second person above">{v(t.pyrophoricSecondPersonVolumeMl, "mL")} pyrophoric</Row>
          <Row label="Autoignition margin">{v(t.autoignitionMarginC, "K")}</Row>
          <Row label="Peroxide tests (months)">
            A {t.peroxideTestIntervalMonths.A} · B {t.peroxideTestIntervalMonths.B} · C {t.peroxideTestIntervalMonths.C} · D {t.peroxideTestIntervalMonths.D} · unopened {t.peroxideTestIntervalMonths.unopened}
          </Row>
        </Group>
      </div>
    </div>
  );
}
