/**
 * Review and release benchmarks (issue 11 item 8), against a real PostgreSQL database:
 *
 * - release of a 96-vial plan (target ≤ 300 ms): the whole `releasePlan` operation — plan
 *   row locked, run sheet and cautions computed, the four linked chemicals' containers
 *   locked, the inventory's proposal, four reservations with their ledger lines and audit
 *   entries, the move, the release mail queued — committed as one transaction;
 * - the prep sheet route's work for the same plan (target ≤ 1.5 s): the plan read and
 *   computed as GET /plans shows it, its signature and reservations, and the PDF rendered
 *   (lib/plans/server/plan-sheets.ts `renderPlanPrepSheet`; the sheets bench times the
 *   rendering alone);
 * - the worklist route's work, for scale.
 *
 * The plan is the reports bench's invented 96-vial Suzuki–Miyaura screen (two temperatures,
 * 48 runs each, on a 96-position block) with its aryl bromide, boronic acid, base and
 * dioxane linked to chemicals this bench stocks in the demo lab. Needs DATABASE_URL (and
 * NEXTAUTH_SECRET) of a migrated, seeded database — the test cluster after
 * `node scripts/test.mjs integration`; without it these cases are left out. It adds rows
 * (plans, chemicals, reservations) to that database.
 */
import { randomUUID } from "node:crypto";
import type { AsyncBenchCase } from "./harness";
import { plan96Document } from "../tests/unit/reports/fixtures";

const LAB = "0b6f0c1e-4a51-4c8e-9d0a-000000000001"; // seeders/20261201000100-demo-labs-and-members.cjs
const CHEMIST = "6d1c2a10-0000-4000-8000-000000000001";
const KEEPER = "6d1c2a10-0000-4000-8000-000000000003";

interface State {
  planIds: string[];
  next: number;
  sheetPlanId: string;
}

const RELEASES = 2 + 15; // warm-ups + timed runs

async function setupAsync(): Promise<State> {
  const { createChemical } = await import("../inventory/server/chemicals");
  const { createContainer } = await import("../inventory/server/containers");
  const { createStudy } = await import("../lib/studies/server/create-study");
  const { createPlan } = await import("../lib/plans/server/create-plan");
  const { releasePlan } = await import("../lib/plans/server/release-plan");
  const tag = randomUUID().slice(0, 8);
  const stock = async (name: string, input: Record<string, unknown>, amount: string, unit: string) => {
    const c = await createChemical({ labId: LAB, actorUserId: KEEPER, input: { name: `${name} (bench ${tag})`, ghsStatements: [], ...input } });
    for (let i = 0; i < 2; i++) await createContainer({ labId: LAB, actorUserId: KEEPER, input: { chemicalId: c.id, barcode: `BN-${tag}-${name.slice(0, 3)}-${i}`, amount, unit, purityPercent: "98" } });
    return c.id;
  };
  const links = {
    arBr: await stock("Aryl bromide", { molarMass: "199.09", density: "1.290", physicalState: "liquid" }, "500", "mL"),
    boronicAcid: await stock("Boronic acid", { molarMass: "152.94", physicalState: "solid" }, "500", "g"),
    base: await stock("Potassium phosphate", { molarMass: "212.27", physicalState: "solid" }, "1", "kg"),
    dioxane: await stock("Dioxane", { molarMass: "88.11", density: "1.033", physicalState: "liquid" }, "4", "L"),
  };
  const study = await createStudy({ labId: LAB, actorUserId: CHEMIST, input: { name: `Release bench ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] } });
  const doc = plan96Document() as unknown as { recipe: { components: Array<Record<string, unknown>>; solvents: Array<Record<string, unknown>> } } & Record<string, unknown>;
  for (const c of doc.recipe.components) if (c.id === "arBr" || c.id === "boronicAcid" || c.id === "base") c.chemicalId = links[c.id];
  for (const s of doc.recipe.solvents) if (s.name === "1,4-dioxane") s.chemicalId = links.dioxane;
  doc.block = { id: "bench-96", name: "96-position block (bench)", positions: 96 };
  const planIds: string[] = [];
  for (let i = 0; i < RELEASES + 1; i++) {
    const plan = await createPlan({ labId: LAB, actorUserId: CHEMIST, studyId: study.id, input: { document: { ...doc, name: `96-vial release bench ${tag} #${i + 1}` } } });
    if (plan.runSheet?.runs.length !== 96) throw new Error(`the bench plan has ${plan.runSheet?.runs.length} runs, not 96`);
    if (plan.signOffRequired || !plan.releasable) throw new Error("the bench plan must be releasable without sign-off");
    planIds.push(plan.id);
  }
  // The sheet cases read a released plan (its reservations and state are on the sheet).
  const sheetPlanId = planIds.pop()!;
  await releasePlan({ labId: LAB, actorUserId: CHEMIST, planId: sheetPlanId });
  return { planIds, next: 0, sheetPlanId };
}

let shared: Promise<State> | null = null;
const state = () => (shared ??= setupAsync());

export const cases: AsyncBenchCase[] = process.env.DATABASE_URL
  ? [
      {
        name: "release: 96-vial plan, 4 linked chemicals reserved, one transaction (PostgreSQL)",
        targetMs: 300,
        repeat: 15,
        warmup: 2,
        setupAsync: state,
        runAsync: async (s) => {
          const st = s as State;
          const { releasePlan } = await import("../lib/plans/server/release-plan");
          const planId = st.planIds[st.next++];
          if (!planId) throw new Error("the bench ran out of draft plans");
          const plan = await releasePlan({ labId: LAB, actorUserId: CHEMIST, planId });
          if (plan.state !== "released" || plan.reservations.length !== 4) throw new Error(`released ${plan.state} with ${plan.reservations.length} reservations`);
          return plan;
        },
        note: () => ["each run releases a fresh draft (created in setup); 4 reservations, 4 ledger lines, 5 audit entries, 1 mail job"],
      },
      {
        name: "prep sheet route work: 96-vial released plan read, computed and rendered (PostgreSQL + pdfmake)",
        targetMs: 1500,
        repeat: 7,
        warmup: 2,
        setupAsync: state,
        runAsync: async (s) => {
          const { renderPlanPrepSheet } = await import("../lib/plans/server/plan-sheets");
          const { pdf } = await renderPlanPrepSheet({ labId: LAB, planId: (s as State).sheetPlanId });
          return pdf.length;
        },
      },
      {
        name: "worklist route work: 96-vial released plan read, computed and written as CSV (PostgreSQL)",
        targetMs: 300,
        repeat: 15,
        warmup: 2,
        setupAsync: state,
        runAsync: async (s) => {
          const { renderPlanWorklist } = await import("../lib/plans/server/plan-sheets");
          return (await renderPlanWorklist({ labId: LAB, planId: (s as State).sheetPlanId })).csv.length;
        },
      },
    ]
  : [];
if (!process.env.DATABASE_URL) console.error("bench/review.bench.ts: DATABASE_URL is not set — the release and sheet-route cases need a migrated, seeded database (see the file's comment)");
