import "server-only";
/**
 * The prep sheet: the PDF a chemist takes to the bench for one plan (issue 11 item 5).
 * It carries the plan, study, author, state, signature and content hash; the safety
 * notice; the cautions worst first with the runs they touch and the GHS pictograms of
 * the chemicals they name; the pictograms of every chemical; the stocks and master
 * mixes to prepare (what to weigh or measure, the solvent, the volume to make up); the
 * vial map; the runs; and the per-vial dispense table in the order of addition, whose
 * rows are those of the worklist CSV (lib/reports/dispense-rows.ts). Every page is
 * numbered "page N of M" and footed with the content hash.
 *
 * Takes plain data and returns the PDF bytes; the plan pages and the release flow call
 * it with what they already hold (see docs/reports.md).
 */
import type { Content, TableCell, TDocumentDefinitions } from "pdfmake/interfaces";
import type { RunSheet } from "../chemistry";
import { CAUTION_RULES, compareCautions, PLANNING_NOTICE, type Caution, type Severity } from "../hazards/caution-rules";
import { GHS_PICTOGRAM_NAMES, type GhsPictogram } from "../hazards/ghs-pictograms";
import type { PlanCautionReport } from "../hazards/plan-cautions";
import type { Equipment, LabThresholds } from "../hazards/thresholds";
import { vialMap, type VialMap } from "../plans/vial-map";
import type { PlanSignature } from "../plans/view";
import { dispenseRows } from "./dispense-rows";
import { celsius, fixed, microlitres, milligrams, significant, utcMinute } from "./format";
import { renderPdf } from "./pdf";
import { pictogramSvg } from "./pictograms";
import type { ChemicalStatements } from "./plan-hazards";
import { SEVERITY_STYLE, sheetStyles, SHEET_PAGE, tableLayout } from "./sheet-style";
import { vialBlockSvg, vialLegendSvg } from "./vial-map-drawing";

/** The e-signature as the plan API returns it (CONTRACT.md `signature`; lib/plans/view.ts). */
export type PrepSheetSignature = PlanSignature;

export interface PrepSheetInput {
  plan: {
    name: string;
    studyName: string;
    authorName: string;
    /** The plan's state (draft, approved, released, …). */
    state: string;
    version?: number | null;
    /** SHA-256 (hex) of the plan document's canonical JSON. */
    contentHash: string;
    labName?: string | null;
  };
  signature: PrepSheetSignature | null;
  /** The run sheet (the `plan` verb's output has every field). */
  runSheet: RunSheet;
  /** The cautions part of the `plan` verb's output. */
  cautions: Pick<PlanCautionReport, "cautions" | "signOffRequired" | "signOffReasons" | "releasable"> & { perRun?: PlanCautionReport["perRun"] };
  /** Positions of the heating block used (24, 48 or 96): the plan document's `block.positions`. */
  blockPositions: number;
  /** Statements and pictograms of the plan's chemicals (`planChemicalHazards(document)`). */
  chemicals?: ChemicalStatements[];
  /** The lab's thresholds and equipment limits the plan was computed with. */
  settings?: { thresholds?: LabThresholds | null; equipment?: Equipment | null };
  /** When the sheet is issued (ISO instant; default now). */
  issuedAt?: string;
}

const SEVERITY_WORD: Record<Severity, string> = { blocking: "BLOCKS", warning: "CAUTION", info: "NOTE" };

function pictogramRow(codes: readonly GhsPictogram[], size: number): Content {
  return {
    columns: codes.map((c) => ({ svg: pictogramSvg(c, size), width: size, height: size })),
    columnGap: 2,
  };
}

function header(input: PrepSheetInput, issuedAt: string): Content[] {
  const p = input.plan;
  const sig = input.signature;
  const meta: Array<[string, string]> = [
    ["Study", p.studyName],
    ["Author", p.authorName],
    ["State", `${p.state}${p.version !== undefined && p.version !== null ? ` (version ${p.version})` : ""}`],
    ["Issued", utcMinute(issuedAt)],
  ];
  if (p.labName) meta.unshift(["Lab", p.labName]);
  let signature: Content;
  if (sig) {
    const bound = sig.contentHash === p.contentHash;
    const valid = sig.valid && bound;
    signature = {
      table: {
        widths: ["*"],
        body: [
          [
            {
              stack: [
                { text: valid ? "Signed" : "Signature VOID — the plan changed after it was signed", style: valid ? "sigOk" : "sigVoid" },
                { text: [{ text: sig.signerName, bold: true }, `, ${utcMinute(sig.signedAt)}: ${sig.meaning}`] },
                { text: [{ text: "Signed content hash  " }, { text: sig.contentHash, font: "Mono", fontSize: 7.5 }], margin: [0, 2, 0, 0] },
              ],
              fillColor: valid ? SEVERITY_STYLE.ok.bg : SEVERITY_STYLE.blocking.bg,
            },
          ],
        ],
      },
      layout: tableLayout("box"),
    };
  } else {
    signature = {
      text: input.cautions.signOffRequired
        ? "Not signed. This plan needs a safety officer's sign-off before anything is weighed."
        : "Not signed: no rule of the lab requires a sign-off for this plan.",
      style: input.cautions.signOffRequired ? "sigVoid" : "muted",
    };
  }
  return [
    { text: "Prep sheet", style: "kicker" },
    { text: p.name, style: "title" },
    {
      table: { widths: [60, "*"], body: meta.map(([k, v]) => [{ text: k, style: "label" }, { text: v }]) },
      layout: "noBorders",
      margin: [0, 4, 0, 6],
    },
    signature,
    {
      text: [{ text: "Content hash (SHA-256)  ", style: "label" }, { text: p.contentHash, font: "Mono", fontSize: 8 }],
      margin: [0, 6, 0, 0],
    },
    { text: PLANNING_NOTICE, style: "notice", margin: [0, 8, 0, 0] },
  ];
}

function summary(sheet: RunSheet, map: VialMap): Content {
  const v = sheet.vessel;
  const temps = map.temperatures.map(celsius).join(", ");
  const finals = sheet.runs.map((r) => r.finalVolumeUl);
  const lo = Math.min(...finals);
  const hi = Math.max(...finals);
  return {
    table: {
      widths: [110, "*"],
      body: [
        [{ text: "Runs", style: "label" }, `${sheet.runs.length} vials in ${map.blocks.length} ${map.blocks.length === 1 ? "block" : "blocks"} of ${map.format.positions} positions (${map.format.rows} × ${map.format.columns})`],
        [{ text: "Set temperatures", style: "label" }, temps],
        [{ text: "Vessel", style: "label" }, `${v.name}: ${significant(v.totalVolumeMl)} mL, rated ${significant(v.ratedBar)} bar absolute, maximum fill ${fixed(v.maxFillFraction * 100, 0)} %`],
        [{ text: "Final volume per vial", style: "label" }, lo === hi ? microlitres(lo) : `${microlitres(lo)} to ${microlitres(hi)}`],
      ],
    },
    layout: "noBorders",
    margin: [0, 0, 0, 4],
  };
}

function cautionsSection(input: PrepSheetInput): Content[] {
  const list = [...input.cautions.cautions].sort(compareCautions);
  const byName = new Map((input.chemicals ?? []).map((c) => [c.name, c]));
  const out: Content[] = [{ text: "Cautions, worst first", style: "h2" }];
  if (!input.cautions.releasable) out.push({ text: "A caution blocks this plan: it cannot be released.", style: "sigVoid", margin: [0, 0, 0, 4] });
  if (input.cautions.signOffReasons.length > 0) {
    out.push({ text: [{ text: "Sign-off required: ", bold: true }, input.cautions.signOffReasons.join(" ")], margin: [0, 0, 0, 4] });
  }
  if (list.length === 0) {
    out.push({ text: "No caution fired for this plan.", style: "muted" });
    return out;
  }
  const body: TableCell[][] = [
    [
      { text: "Severity", style: "th" },
      { text: "Caution", style: "th" },
      { text: "Runs", style: "th" },
      { text: "GHS", style: "th" },
    ],
  ];
  for (const c of list) {
    const rule = (CAUTION_RULES as Record<string, { title: string } | undefined>)[c.code];
    const chem = c.component ? byName.get(c.component) : undefined;
    const sev = SEVERITY_STYLE[c.severity === "blocking" ? "blocking" : c.severity === "warning" ? "warning" : "ok"];
    body.push([
      { text: SEVERITY_WORD[c.severity], bold: true, color: sev.fg, fillColor: sev.bg, fontSize: 7.5 },
      {
        stack: [
          { text: [{ text: `${c.code} `, bold: true }, { text: rule?.title ?? "", bold: true }, c.component ? ` — ${c.component}` : ""] },
          { text: c.message, margin: [0, 1, 0, 0] },
          { text: [{ text: "Remedy: ", italics: true }, c.remedy], color: "#4b4a4f", margin: [0, 1, 0, 0] },
        ],
      },
      { text: runList(c), fontSize: 7.5 },
      chem && chem.pictograms.length > 0 ? pictogramRow(chem.pictograms, 20) : { text: "" },
    ]);
  }
  out.push({ table: { headerRows: 1, widths: [44, "*", 70, 66], body, dontBreakRows: true }, layout: tableLayout("rows") });
  return out;
}

/** "all 18 runs" or the run numbers. */
function runList(c: Caution): string {
  if (c.runs.length === 0) return "plan-wide";
  const sorted = [...c.runs].sort((a, b) => a - b);
  return `${sorted.length} ${sorted.length === 1 ? "run" : "runs"}: ${sorted.join(", ")}`;
}

function pictogramSection(chemicals: readonly ChemicalStatements[]): Content[] {
  const shown = chemicals.filter((c) => c.statements.length > 0);
  if (shown.length === 0) return [];
  const body: TableCell[][] = [[{ text: "Pictograms", style: "th" }, { text: "Chemical", style: "th" }, { text: "Hazard statements", style: "th" }]];
  for (const c of shown) {
    body.push([
      c.pictograms.length > 0 ? pictogramRow(c.pictograms, 24) : { text: "none", style: "muted" },
      { stack: [{ text: c.name }, { text: c.pictograms.map((p) => `${p} ${GHS_PICTOGRAM_NAMES[p]}`).join(", "), style: "small" }] },
      { text: c.statements.join(", ") },
    ]);
  }
  return [
    { text: "Chemicals and their GHS pictograms", style: "h2" },
    { table: { headerRows: 1, widths: [150, "*", 130], body, dontBreakRows: true }, layout: tableLayout("rows") },
  ];
}

function stocksSection(sheet: RunSheet): Content[] {
  const out: Content[] = [{ text: "Stocks and master mixes to prepare", style: "h2" }];
  if (sheet.stocks.length === 0) {
    out.push({ text: "None: every component is weighed or dispensed into each vial directly.", style: "muted" });
    return out;
  }
  for (const s of sheet.stocks) {
    const body: TableCell[][] = [
      [
        { text: "Component", style: "th" },
        { text: "Weigh", style: "th", alignment: "right" },
        { text: "or measure", style: "th", alignment: "right" },
        { text: "Concentration", style: "th", alignment: "right" },
        { text: "Amount", style: "th", alignment: "right" },
      ],
    ];
    for (const m of s.members) {
      body.push([
        m.name,
        { text: m.weighMg === null ? "—" : milligrams(m.weighMg), alignment: "right" },
        { text: m.measureUl === null ? "—" : microlitres(m.measureUl), alignment: "right" },
        { text: `${significant(m.concentrationM, 3)} M (${significant(m.concentrationMgPerMl, 4)} mg/mL)`, alignment: "right" },
        { text: `${significant(m.mmol, 4)} mmol`, alignment: "right" },
      ]);
    }
    out.push({
      stack: [
        { text: [{ text: `${s.id} `, bold: true }, { text: s.kind === "master-mix" ? "master mix" : "stock solution", bold: true }, ` — ${s.name}`], margin: [0, 4, 0, 2] },
        {
          text: [
            "Make up to ",
            { text: microlitres(s.finalVolumeUl), bold: true },
            ` with ${s.solvent}. Needed ${microlitres(s.neededVolumeUl)} + ${fixed(s.overagePercent, 0)} % overage + ${microlitres(s.deadVolumeUl)} dead volume.`,
            s.dispenseVolumeUl !== null ? ` Dispense ${microlitres(s.dispenseVolumeUl)} into every vial.` : " Volumes per vial vary: see the dispense table.",
          ],
          margin: [0, 0, 0, 2],
        },
        { table: { headerRows: 1, widths: ["*", 62, 62, 110, 62], body }, layout: tableLayout("rows") },
        ...s.notes.map((n): Content => ({ text: n, style: "small", margin: [0, 1, 0, 0] })),
      ],
      unbreakable: s.members.length < 8,
    });
  }
  return out;
}

function vialMapSection(map: VialMap): Content[] {
  const cell = map.format.positions === 96 ? 32 : map.format.positions === 48 ? 26 : 30;
  const blocks: Content[] = map.blocks.map((b) => ({ svg: vialBlockSvg(b, { cell, font: "Sans", print: true }), margin: [0, 0, 0, 8] }));
  // Two narrow blocks side by side; a 96-position block takes the page width.
  const rows: Content[] = [];
  if (map.format.positions === 96) rows.push(...blocks);
  else for (let i = 0; i < blocks.length; i += 2) rows.push({ columns: blocks.slice(i, i + 2).map((b) => ({ stack: [b], width: "auto" })), columnGap: 24 });
  return [
    { text: "Vial map", style: "h2", pageBreak: "before" },
    { text: "One block per set temperature; runs in run order, row by row (A1, A2, …). The number in each vial is the run.", style: "small", margin: [0, 0, 0, 6] },
    { svg: vialLegendSvg(map, { font: "Sans", width: 520 }), margin: [0, 0, 0, 8] },
    ...rows,
  ];
}

function runsSection(input: PrepSheetInput, map: VialMap): Content[] {
  const sheet = input.runSheet;
  const factorNames = [...new Set(sheet.runs.flatMap((r) => Object.keys(r.natural)))];
  const place = new Map(map.placements.map((p) => [p.run, p]));
  const bar = new Map((input.cautions.perRun ?? []).map((p) => [p.run, p.totalBar]));
  const head: TableCell[] = [
    { text: "Run", style: "th" },
    { text: "Order", style: "th" },
    { text: "Vial", style: "th" },
    { text: "Kind", style: "th" },
    ...factorNames.map((f): TableCell => ({ text: f, style: "th", alignment: "right" })),
    { text: "Final volume", style: "th", alignment: "right" },
    { text: "Est. pressure", style: "th", alignment: "right" },
  ];
  const body: TableCell[][] = [head];
  const ordered = [...sheet.runs].sort((a, b) => (place.get(a.run)!.block - place.get(b.run)!.block) || a.runOrder - b.runOrder);
  for (const r of ordered) {
    const p = place.get(r.run)!;
    const b = bar.get(r.run);
    body.push([
      { text: String(r.run), bold: true },
      String(r.runOrder),
      p.vial,
      r.kind,
      ...factorNames.map((f): TableCell => {
        const v = r.natural[f];
        return { text: v === undefined ? "—" : f === "temperature" ? celsius(v) : significant(v, 4), alignment: "right" };
      }),
      { text: microlitres(r.finalVolumeUl), alignment: "right" },
      { text: b === null || b === undefined ? "—" : `${fixed(b, 2)} bar`, alignment: "right" },
    ]);
  }
  const widths = [24, 28, 34, 44, ...factorNames.map(() => "*" as const), 56, 52];
  return [
    { text: "Runs", style: "h2", pageBreak: "before" },
    { text: "Natural factor values as designed; pressures are the estimated absolute pressure in the sealed vial at the set temperature.", style: "small", margin: [0, 0, 0, 4] },
    { table: { headerRows: 1, widths, body }, layout: tableLayout("rows"), fontSize: 7.5 },
  ];
}

function dispenseSection(sheet: RunSheet, map: VialMap): Content[] {
  const rows = dispenseRows(sheet, map);
  // One table per step of the order of addition: what to add and from where in its
  // heading, then every vial with its amount. The rows are the worklist CSV's.
  const groups: Array<{ key: string; step: number; what: string; from: string; unit: string; rows: typeof rows }> = [];
  const byKey = new Map<string, (typeof groups)[number]>();
  for (const r of rows) {
    const key = `${r.step}|${r.what}|${r.from}`;
    let g = byKey.get(key);
    if (!g) {
      g = { key, step: r.step, what: r.what, from: r.from, unit: r.unit, rows: [] };
      byKey.set(key, g);
      groups.push(g);
    }
    g.rows.push(r);
  }
  const out: Content[] = [
    { text: "Dispense table, in the order of addition", style: "h2", pageBreak: "before" },
    {
      text: "Each step goes into every vial before the next step. Solids are weighed into the vial (mg); every liquid is pipetted (µL). The rows are those of the worklist CSV.",
      style: "small",
      margin: [0, 0, 0, 4],
    },
  ];
  for (const g of groups) {
    const body: TableCell[][] = [
      [{ text: [{ text: `Step ${g.step}  `, bold: true }, { text: g.what, bold: true }, `  ·  ${g.from}  ·  ${g.unit === "mg" ? "weigh, mg" : "pipette, µL"}`], colSpan: 4, fillColor: "#ebe3d3" }, "", "", ""],
      [{ text: "Vial", style: "th" }, { text: "Run", style: "th" }, { text: "Amount", style: "th", alignment: "right" }, { text: "Done", style: "th" }],
    ];
    for (const r of g.rows) {
      body.push([r.vial, String(r.run), { text: r.amount === null ? "—" : r.unit === "mg" ? milligrams(r.amount) : microlitres(r.amount), alignment: "right" }, ""]);
    }
    out.push({ table: { headerRows: 2, widths: [50, 40, 70, "*"], body }, layout: tableLayout("dispense"), fontSize: 8, margin: [0, 0, 0, 8] });
  }
  return out;
}

function settingsSection(input: PrepSheetInput): Content[] {
  const d = input.runSheet.dispensing;
  const rows: Array<[string, string]> = [
    ["Minimum pipette volume", microlitres(d.minPipetteVolumeUl)],
    ["Minimum weighing mass", milligrams(d.minWeighMassMg)],
    ["Overage", `${fixed(d.overagePercent, 0)} %`],
    ["Dead volume", microlitres(d.deadVolumeUl)],
    ["Largest stock", `${significant(d.maxStockVolumeMl)} mL`],
    ["Stock fill fraction", `${fixed(d.stockFillFraction * 100, 0)} %`],
  ];
  const t = input.settings?.thresholds;
  if (t) {
    rows.push(
      ["Safety factor on the vessel rating", fixed(t.safetyFactor, 2)],
      ["Sign-off temperature", celsius(t.signOffTemperatureC)],
      ["Pyrophoric second-person volume", `${significant(t.pyrophoricSecondPersonVolumeMl)} mL`],
      ["Autoignition margin", `${significant(t.autoignitionMarginC)} K`],
      [
        "Peroxide test intervals",
        `A ${t.peroxideTestIntervalMonths.A}, B ${t.peroxideTestIntervalMonths.B}, C ${t.peroxideTestIntervalMonths.C}, D ${t.peroxideTestIntervalMonths.D}, unopened ${t.peroxideTestIntervalMonths.unopened} months`,
      ],
    );
  }
  const e = input.settings?.equipment;
  if (e) rows.push(["Heating block maximum", celsius(e.blockMaxC)], ["Cooling minimum", celsius(e.coolingMinC)]);
  return [
    { text: "Lab settings this sheet was computed with", style: "h2" },
    { table: { widths: [170, "*"], body: rows.map(([k, v]) => [{ text: k, style: "label" }, v]) }, layout: tableLayout("list") },
  ];
}

/** The pdfmake document of a prep sheet (exported for tests that inspect the layout). */
export function prepSheetDefinition(input: PrepSheetInput): TDocumentDefinitions {
  const issuedAt = input.issuedAt ?? new Date().toISOString();
  const map = vialMap(input.runSheet.runs, { positions: input.blockPositions });
  const shortHash = input.plan.contentHash.slice(0, 12);
  return {
    ...SHEET_PAGE,
    info: { title: `Prep sheet — ${input.plan.name}`, author: input.plan.authorName, subject: input.plan.studyName, creator: "Tareline", producer: "Tareline" },
    footer: (currentPage: number, pageCount: number): Content => ({
      columns: [
        { text: `${input.plan.name} · content ${shortHash}…`, style: "footer" },
        { text: `page ${currentPage} of ${pageCount}`, style: "footer", alignment: "right", width: 80 },
      ],
      margin: [SHEET_PAGE.pageMargins[0], 10, SHEET_PAGE.pageMargins[2], 0],
    }),
    content: [
      ...header(input, issuedAt),
      { text: "Plan", style: "h2" },
      summary(input.runSheet, map),
      ...cautionsSection(input),
      ...pictogramSection(input.chemicals ?? []),
      ...stocksSection(input.runSheet),
      ...settingsSection(input),
      ...vialMapSection(map),
      ...runsSection(input, map),
      ...dispenseSection(input.runSheet, map),
      { text: PLANNING_NOTICE, style: "notice", margin: [0, 10, 0, 0] },
    ],
    styles: sheetStyles,
  };
}

/**
 * Renders the prep sheet of a plan to a PDF.
 * Example: await renderPrepSheet({ plan: { name, studyName, authorName, state, contentHash }, signature: null,
 *   runSheet: report, cautions: report, blockPositions: 24, chemicals: planChemicalHazards(document) })
 * @throws AppError("invalid_input") naming `positions` for a block format other than 24, 48 or 96.
 */
export async function renderPrepSheet(input: PrepSheetInput): Promise<Buffer> {
  return renderPdf(prepSheetDefinition(input));
}
