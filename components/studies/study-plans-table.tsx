"use client";

import Link from "next/link";
import type { PlanSummary } from "@/lib/plans/schemas";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { buttonClass } from "@/components/ui/button";
import { PlanStateBadge, When } from "./bits";

const col = tableColumns<PlanSummary>();

/** The plans of one study: state, author, last change and run count. */
export function StudyPlansTable({ labSlug, studyId, plans, canEdit }: { labSlug: string; studyId: string; plans: PlanSummary[]; canEdit: boolean }) {
  const columns = col.columns([
    col.accessor("name", {
      header: "Plan",
      cell: (info) => (
        <Link href={`/labs/${labSlug}/studies/${studyId}/plans/${info.row.original.id}`} className="font-medium">
          {info.getValue()}
        </Link>
      ),
    }),
    col.accessor("state", { header: "State", cell: (info) => <PlanStateBadge state={info.getValue()} /> }),
    col.accessor("authorName", { header: "Author" }),
    col.accessor("updatedAt", { header: "Updated (UTC)", cell: (info) => <When iso={info.getValue()} /> }),
    col.accessor("runCount", {
      header: "Runs",
      cell: (info) => {
        const n = info.getValue();
        return n === null ? <span className="text-ink-faint">—</span> : <span className="num">{n}</span>;
      },
    }),
  ]);
  return (
    <DataTable
      columns={columns}
      data={plans}
      rowId={(p) => p.id}
      rowTestId={(p) => `plan-row-${p.name}`}
      testId="study-plans"
      empty={
        <div className="flex flex-col items-center gap-2">
          <p>No plans in this study yet. A plan is one designed set of vials: the recipe, the factors to vary and the design.</p>
          {canEdit && (
            <Link href={`/labs/${labSlug}/studies/${studyId}/plans/new`} className={buttonClass("primary")}>
              New plan
            </Link>
          )}
        </div>
      }
    />
  );
}
