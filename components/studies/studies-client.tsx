"use client";

import Link from "next/link";
import { useEffect, useMemo, useState } from "react";
import type { StudyPage, StudyQuery, StudyRow } from "@/lib/studies/schemas";
import { useStudies } from "@/lib/hooks/use-studies";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { buttonClass } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { When, responseGoalText } from "./bits";

const col = tableColumns<StudyRow>();
const SORTABLE = ["name", "updatedAt"] as const;
const PAGE_SIZE = 25;
const INITIAL = { sort: "updatedAt", dir: "desc" } as const;

/** The lab's studies: name filter, sort and paging on the server (GET /api/labs/{lab}/studies). */
export function StudiesClient({ labSlug, canCreate, initial }: { labSlug: string; canCreate: boolean; initial: StudyPage }) {
  const [search, setSearch] = useState("");
  const [q, setQ] = useState("");
  const [sort, setSort] = useState<{ id: StudyQuery["sort"]; desc: boolean }>({ id: INITIAL.sort, desc: true });
  const [page, setPage] = useState(1);

  useEffect(() => {
    const t = setTimeout(() => {
      setQ(search.trim());
      setPage(1);
    }, 250);
    return () => clearTimeout(t);
  }, [search]);

  const query = useMemo(() => {
    const p = new URLSearchParams({ sort: sort.id, dir: sort.desc ? "desc" : "asc", page: String(page), pageSize: String(PAGE_SIZE) });
    if (q) p.set("q", q);
    return p.toString();
  }, [q, sort, page]);
  const isInitial = !q && page === 1 && sort.id === INITIAL.sort && sort.desc;
  const { data, error, isLoading } = useStudies(labSlug, query, isInitial ? initial : undefined);
  const rows = data?.studies ?? [];
  const total = data?.total ?? 0;

  const columns = col.columns([
    col.accessor("name", {
      header: "Study",
      cell: (info) => (
        <div className="min-w-48">
          <Link href={`/labs/${labSlug}/studies/${info.row.original.id}`} className="font-medium" data-testid={`open-study-${info.row.original.id}`}>
            {info.getValue()}
          </Link>
          {info.row.original.goal && <div className="line-clamp-2 max-w-md text-xs text-ink-soft">{info.row.original.goal}</div>}
        </div>
      ),
    }),
    col.display({
      id: "responses",
      header: "Responses",
      cell: ({ row }) => (
        <ul className="text-xs">
          {row.original.responses.map((r) => (
            <li key={r.name}>
              <span className="font-mono">{r.name}</span> <span className="text-ink-faint">{responseGoalText(r)}</span>
            </li>
          ))}
        </ul>
      ),
    }),
    col.accessor("planCount", { header: "Plans", cell: (info) => <span className="num">{info.getValue()}</span> }),
    col.accessor("authorName", { header: "Started by" }),
    col.accessor("updatedAt", { id: "updatedAt", header: "Updated (UTC)", cell: (info) => <When iso={info.getValue()} /> }),
  ]);

  const empty = isLoading ? (
    "Loading…"
  ) : q ? (
    `No study has “${q}” in its name.`
  ) : canCreate ? (
    <div className="flex flex-col items-center gap-2" data-testid="studies-empty-start">
      <p>No studies yet. A study names what you want to improve: the goal, the product, and the responses you will measure (a yield to maximise, an impurity to keep low).</p>
      <p>Start one, then add plans to it: each plan is one designed set of vials.</p>
      <Link href={`/labs/${labSlug}/studies/new`} className={buttonClass("primary")}>
        New study
      </Link>
    </div>
  ) : (
    "No studies yet. Chemists and lab admins start them; they will show here."
  );

  return (
    <div className="flex flex-col gap-4">
      <label className="flex max-w-md flex-col gap-1 text-sm">
        <span className="font-medium text-ink-soft">Find a study by name</span>
        <input type="search" className={inputClass} placeholder="Part of the name" value={search} onChange={(e) => setSearch(e.target.value)} data-testid="study-search" />
      </label>
      {error && <Banner tone="blocks">{(error as Error).message}</Banner>}
      <DataTable
        columns={columns}
        data={rows}
        rowId={(r) => r.id}
        rowTestId={(r) => `study-row-${r.name}`}
        testId="studies"
        sorting={sort}
        sortableIds={SORTABLE}
        onSortingChange={(id) => {
          setSort((s) => ({ id: id as StudyQuery["sort"], desc: s.id === id ? !s.desc : id !== "name" }));
          setPage(1);
        }}
        empty={empty}
        paging={{ page, pageSize: PAGE_SIZE, total, noun: ["study", "studies"], onChange: (p) => setPage(p) }}
      />
    </div>
  );
}
