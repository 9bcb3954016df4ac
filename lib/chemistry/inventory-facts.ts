/**
 * Hazard facts of a plan's components from the lab's inventory. A component or solvent
 * of the plan document may name `chemicalId`, a chemical of the lab's catalogue; its
 * hazards then come from the chemical record (GHS statements, pyrophoric and
 * water-reactive flags, peroxide class) and from the container the inventory will take
 * it from (opened, received, last peroxide test, expiry). Dates typed into a linked
 * component are ignored and overwritten; a linked component with no usable container
 * gets no container dates (the peroxide rule then says the opening date is not recorded).
 *
 * Statements and flags are combined so that nothing typed can lower a hazard the record
 * states: the record's statements plus any typed ones; a flag is set when either says so;
 * the record's peroxide class, else a typed one. Physical facts (state, formula, density,
 * purity) are not overwritten — the document's amounts are what the chemist planned — but
 * a formula the document leaves out is filled in from the record, and every disagreement
 * is returned as an issue at the document path, for the editor to show.
 */
import type { FieldIssue } from "../errors/app-error";
import type { PeroxideClass } from "../hazards/hazard-flags";
import type { PlanDocumentInput } from "./plan-document";

/** What the inventory records about one chemical and the container a plan would use. */
export interface InventoryChemicalFacts {
  chemicalId: string;
  name: string;
  ghsStatements: string[];
  pyrophoric: boolean;
  waterReactive: boolean;
  peroxideClass: PeroxideClass | null;
  physicalState: "solid" | "liquid" | "gas" | "solution";
  formula: string | null;
  molarMassGPerMol: number | null;
  densityGPerMl: number | null;
  /** The container the inventory would propose (first to expire first, opened before sealed), or null when none is usable. */
  container: {
    id: string;
    barcode: string;
    openedOn: string | null;
    receivedOn: string | null;
    peroxideTestedOn: string | null;
    expiresOn: string | null;
    /** Assay of the container (%), when recorded. */
    purityPercent: number | null;
    /** Molarity of a solution container (M), when recorded in M. */
    molarityM: number | null;
  } | null;
}

export interface LinkedPlan {
  document: PlanDocumentInput;
  /** Where the document disagrees with the inventory, or names a chemical it does not have. */
  issues: FieldIssue[];
}

type Facts = Readonly<Record<string, InventoryChemicalFacts>> | ReadonlyMap<string, InventoryChemicalFacts>;
type ComponentInput = PlanDocumentInput["recipe"]["components"][number];
type SolventInput = PlanDocumentInput["recipe"]["solvents"][number];

function lookup(facts: Facts, id: string): InventoryChemicalFacts | undefined {
  return facts instanceof Map ? facts.get(id) : (facts as Readonly<Record<string, InventoryChemicalFacts>>)[id];
}

const union = (a: readonly string[], b: readonly string[] | undefined): string[] => [...new Set([...a, ...(b ?? [])])];

/** The container dates of the facts, replacing whatever was typed. */
function containerDates(f: InventoryChemicalFacts): { openedOn?: string | null; receivedOn?: string | null; peroxideTestedOn?: string | null; expiresOn?: string | null } {
  const c = f.container;
  if (!c) return {};
  return { openedOn: c.openedOn, receivedOn: c.receivedOn, peroxideTestedOn: c.peroxideTestedOn, expiresOn: c.expiresOn };
}

const close = (a: number, b: number, rel: number) => Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b));

function linkComponent(c: ComponentInput, f: InventoryChemicalFacts, path: string, issues: FieldIssue[]): ComponentInput {
  const typed = c.hazards ?? {};
  const { openedOn: _o, receivedOn: _r, peroxideTestedOn: _p, expiresOn: _e, ...typedFlags } = typed;
  const hazards = {
    ...typedFlags,
    ghs: union(f.ghsStatements, typed.ghs),
    pyrophoric: f.pyrophoric || typed.pyrophoric === true,
    waterReactive: f.waterReactive || typed.waterReactive === true,
    ...(f.peroxideClass ?? typed.peroxideClass ? { peroxideClass: f.peroxideClass ?? typed.peroxideClass } : {}),
    ...containerDates(f),
  };
  const out: ComponentInput = { ...c, hazards };
  if (c.formula === undefined && c.molarMassGPerMol === undefined && c.smiles === undefined) {
    if (f.formula) out.formula = f.formula;
    else if (f.molarMassGPerMol !== null) out.molarMassGPerMol = f.molarMassGPerMol;
  }
  const form = c.form as { state?: string; densityGPerMl?: number; purityWtPercent?: number; molarityM?: number } | undefined;
  const state = form?.state;
  const recorded = f.physicalState === "gas" ? null : f.physicalState;
  if (state && recorded && state !== recorded) {
    issues.push({ path: `${path}.form.state`, message: `the inventory records ${f.name} as a ${recorded}` });
  }
  if (state === "liquid" && form?.densityGPerMl !== undefined && f.densityGPerMl !== null && !close(form.densityGPerMl, f.densityGPerMl, 0.01)) {
    issues.push({ path: `${path}.form.densityGPerMl`, message: `the inventory records a density of ${f.densityGPerMl} g/mL for ${f.name}` });
  }
  const purity = f.container?.purityPercent ?? null;
  if ((state === "solid" || state === "liquid") && purity !== null && !close(form?.purityWtPercent ?? 100, purity, 0.005)) {
    issues.push({ path: `${path}.form.purityWtPercent`, message: `container ${f.container!.barcode} of ${f.name} is ${purity} % pure` });
  }
  const molarity = f.container?.molarityM ?? null;
  if (state === "solution" && form?.molarityM !== undefined && molarity !== null && !close(form.molarityM, molarity, 0.005)) {
    issues.push({ path: `${path}.form.molarityM`, message: `container ${f.container!.barcode} of ${f.name} is ${molarity} M` });
  }
  return out;
}

function linkSolvent(s: SolventInput, f: InventoryChemicalFacts): SolventInput {
  const { openedOn: _o, receivedOn: _r, peroxideTestedOn: _p, expiresOn: _e, ...rest } = s;
  return {
    ...rest,
    ghs: union(f.ghsStatements, s.ghs),
    ...(f.peroxideClass ?? s.peroxideClass ? { peroxideClass: f.peroxideClass ?? s.peroxideClass } : {}),
    ...containerDates(f),
  };
}

/**
 * The document with the hazard facts of every inventory-linked component and solvent
 * taken from the inventory (see the module comment), and the issues found on the way
 * (a chemical the facts do not have: `recipe.components.<i>.chemicalId`; a state,
 * density, purity or molarity that disagrees with the record: `….form.<field>`).
 * Pure: the input document is not changed.
 */
export function applyInventoryFacts(doc: PlanDocumentInput, facts: Facts): LinkedPlan {
  const issues: FieldIssue[] = [];
  const components = doc.recipe.components.map((c, i) => {
    if (c.chemicalId === undefined) return c;
    const f = lookup(facts, c.chemicalId);
    const path = `recipe.components.${i}`;
    if (!f) {
      issues.push({ path: `${path}.chemicalId`, message: "names no chemical of the lab's inventory" });
      return c;
    }
    return linkComponent(c, f, path, issues);
  });
  const solvents = doc.recipe.solvents.map((s, i) => {
    if (s.chemicalId === undefined) return s;
    const f = lookup(facts, s.chemicalId);
    if (!f) {
      issues.push({ path: `recipe.solvents.${i}.chemicalId`, message: "names no chemical of the lab's inventory" });
      return s;
    }
    return linkSolvent(s, f);
  });
  return { document: { ...doc, recipe: { ...doc.recipe, components, solvents } }, issues };
}

/** The chemical ids a plan document links to, each once. */
export function linkedChemicalIds(doc: PlanDocumentInput): string[] {
  const ids = [...doc.recipe.components.map((c) => c.chemicalId), ...doc.recipe.solvents.map((s) => s.chemicalId)];
  return [...new Set(ids.filter((x): x is string => typeof x === "string"))];
}
