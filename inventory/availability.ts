/**
 * Availability: for a list of required amounts (from a run sheet), propose the containers
 * to take them from, report what is short per chemical, and warn about expired
 * containers, peroxide formers past their test date and chemicals under their low-stock
 * mark. Pure: the caller loads the lab's chemicals and containers and passes them in.
 *
 * Order of preference (the release rule): first to expire first (FEFO), then opened
 * containers before sealed ones, then the smaller available amount (use up part-used
 * containers), then barcode for a stable order. One container that covers the whole
 * requirement is preferred; otherwise containers are taken in that order until covered.
 */
import { add, ceil, cmp, div, isZero, min, mul, rational, sub, toNumber, type Rational } from "./decimal";
import { perBaseUnit, quantityInUnit, requirementQuantity, type ChemicalConstants, type ContainerChemistry } from "./conversion";
import { isPeroxideTestDue, peroxideTestDue, type PeroxideClass, type PeroxideIntervals } from "./peroxide";
import { formatAmount, type Dimension } from "./units";

export interface ChemicalFacts extends ChemicalConstants {
  id: string;
  name: string;
  peroxideClass: PeroxideClass | null;
  /** GHS statements of the record (EUH019 without a class: an unclassified peroxide former). */
  ghsStatements?: readonly string[];
  /** Low-stock mark in base units of `lowStockDimension`, or null for none. */
  lowStockBase: bigint | null;
  lowStockDimension: Dimension | null;
}

export interface ContainerFacts extends ContainerChemistry {
  id: string;
  barcode: string;
  chemicalId: string;
  amountBase: bigint;
  /** Already held by other reservations. */
  heldBase: bigint;
  status: "available" | "quarantined" | "empty" | "disposed";
  receivedOn: string | null;
  openedOn: string | null;
  expiresOn: string | null;
  peroxideTestedOn: string | null;
}

export interface Requirement {
  chemicalId: string;
  /** Decimal amount in `unit`: mmol (µmol, mol), a mass (µg, mg, g, kg) or a volume (µL, mL, L). */
  amount: string | number;
  unit: string;
  /** What the requirement is for, e.g. "Study B / run sheet 3", shown in shortfalls. */
  label?: string;
}

export interface Pick {
  containerId: string;
  barcode: string;
  /** What to reserve from the container, in its base units (rounded up). */
  amountBase: bigint;
  dimension: Dimension;
  display: string;
}

export interface ProposalLine {
  requirement: number;
  chemicalId: string;
  picks: Pick[];
  /** The part not covered, in the requirement's unit, or null when fully covered. */
  shortfall: { amount: number; unit: string } | null;
}

export type WarningCode = "expired" | "peroxide_test_due" | "low_stock" | "not_convertible" | "unknown_chemical";
export interface AvailabilityWarning {
  code: WarningCode;
  chemicalId: string;
  containerId?: string;
  message: string;
}

export interface Proposal {
  lines: ProposalLine[];
  shortfalls: Array<{ chemicalId: string; name: string; amount: number; unit: string; label?: string }>;
  warnings: AvailabilityWarning[];
}

/** FEFO, then opened before sealed, then smaller available amount, then barcode. */
export function preferenceOrder(a: ContainerFacts, b: ContainerFacts): number {
  const ea = a.expiresOn ?? "9999-12-31";
  const eb = b.expiresOn ?? "9999-12-31";
  if (ea !== eb) return ea < eb ? -1 : 1;
  if (!!a.openedOn !== !!b.openedOn) return a.openedOn ? -1 : 1;
  const fa = a.amountBase - a.heldBase;
  const fb = b.amountBase - b.heldBase;
  if (fa !== fb) return fa < fb ? -1 : 1;
  return a.barcode.localeCompare(b.barcode);
}

/** The date a container of `chem` is due its next peroxide test (lib/hazards/peroxide-due.ts), or null. */
export function containerPeroxideDue(chem: ChemicalFacts, c: ContainerFacts, intervals: PeroxideIntervals): string | null {
  return peroxideTestDue({
    peroxideClass: chem.peroxideClass,
    ghs: chem.ghsStatements ?? [],
    openedOn: c.openedOn,
    receivedOn: c.receivedOn,
    testedOn: c.peroxideTestedOn,
    expiresOn: c.expiresOn,
    intervals,
  });
}

/**
 * Proposes containers for every requirement (in the order given; amounts taken by one
 * requirement are no longer available to the next), with shortfalls and warnings.
 * `today` is an ISO date (YYYY-MM-DD).
 * @throws RangeError for a requirement whose unit is not mmol, a mass or a volume.
 */
export function proposeContainers(input: {
  requirements: Requirement[];
  chemicals: ChemicalFacts[];
  containers: ContainerFacts[];
  today: string;
  peroxideIntervals: PeroxideIntervals;
}): Proposal {
  const chemicals = new Map(input.chemicals.map((c) => [c.id, c]));
  const free = new Map(input.containers.map((c) => [c.id, c.amountBase - c.heldBase]));
  const warnings: AvailabilityWarning[] = [];
  const warned = new Set<string>();
  const warn = (w: AvailabilityWarning) => {
    const key = `${w.code}:${w.chemicalId}:${w.containerId ?? ""}`;
    if (!warned.has(key)) {
      warned.add(key);
      warnings.push(w);
    }
  };
  const lines: ProposalLine[] = [];
  const shortfalls: Proposal["shortfalls"] = [];

  input.requirements.forEach((req, index) => {
    const chem = chemicals.get(req.chemicalId);
    const q = requirementQuantity(req.amount, req.unit);
    if (!q) throw new RangeError(`requirements.${index}.unit: unknown unit "${req.unit}"`);
    if (!chem) {
      warn({ code: "unknown_chemical", chemicalId: req.chemicalId, message: `Requirement ${index + 1}: no such chemical in this lab.` });
      lines.push({ requirement: index, chemicalId: req.chemicalId, picks: [], shortfall: { amount: Number(req.amount), unit: req.unit } });
      shortfalls.push({ chemicalId: req.chemicalId, name: "unknown chemical", amount: Number(req.amount), unit: req.unit, label: req.label });
      return;
    }
    const candidates: Array<{ c: ContainerFacts; per: Rational; availableQ: Rational }> = [];
    for (const c of input.containers.filter((x) => x.chemicalId === chem.id && x.status === "available").sort(preferenceOrder)) {
      if (c.expiresOn && c.expiresOn < input.today) {
        warn({ code: "expired", chemicalId: chem.id, containerId: c.id, message: `${c.barcode} (${chem.name}) expired on ${c.expiresOn}; not proposed.` });
        continue;
      }
      const due = containerPeroxideDue(chem, c, input.peroxideIntervals);
      if (due && isPeroxideTestDue(due, input.today)) {
        const cls = chem.peroxideClass ? `a class ${chem.peroxideClass}` : "an unclassified";
        warn({ code: "peroxide_test_due", chemicalId: chem.id, containerId: c.id, message: `${c.barcode} (${chem.name}) is ${cls} peroxide former whose test is due since ${due}: test it before use.` });
      }
      const per = perBaseUnit(q.measure, c, chem);
      if (!per.ok) {
        warn({ code: "not_convertible", chemicalId: chem.id, containerId: c.id, message: `${c.barcode} (${chem.name}) cannot supply an amount in ${req.unit}: ${per.reason}.` });
        continue;
      }
      const f = free.get(c.id) ?? 0n;
      if (f <= 0n || isZero(per.value)) continue;
      candidates.push({ c, per: per.value, availableQ: mul(rational(f), per.value) });
    }
    let remaining = q.quantity;
    const picks: Pick[] = [];
    const take = (cand: (typeof candidates)[number], want: Rational) => {
      const f = free.get(cand.c.id) ?? 0n;
      const got = min(want, cand.availableQ);
      let base = ceil(div(got, cand.per));
      if (base > f) base = f;
      free.set(cand.c.id, f - base);
      picks.push({ containerId: cand.c.id, barcode: cand.c.barcode, amountBase: base, dimension: cand.c.dimension, display: formatAmount(base, cand.c.dimension) });
      return got;
    };
    const single = candidates.find((cand) => cmp(cand.availableQ, remaining) >= 0);
    if (single) remaining = sub(remaining, take(single, remaining));
    else
      for (const cand of candidates) {
        if (cmp(remaining, rational(0n)) <= 0) break;
        remaining = sub(remaining, take(cand, remaining));
      }
    let shortfall: ProposalLine["shortfall"] = null;
    if (cmp(remaining, rational(0n)) > 0) {
      shortfall = { amount: toNumber(quantityInUnit(remaining, req.unit)), unit: req.unit };
      shortfalls.push({ chemicalId: chem.id, name: chem.name, ...shortfall, label: req.label });
    }
    lines.push({ requirement: index, chemicalId: chem.id, picks, shortfall });
  });

  // Low stock: what would be left of each chemical after these picks, against its mark.
  for (const chem of chemicals.values()) {
    if (chem.lowStockBase === null || !chem.lowStockDimension) continue;
    if (!lines.some((l) => l.chemicalId === chem.id)) continue;
    const left = input.containers
      .filter((c) => c.chemicalId === chem.id && c.status === "available" && c.dimension === chem.lowStockDimension && !(c.expiresOn && c.expiresOn < input.today))
      .reduce((s, c) => add(s, rational(free.get(c.id) ?? 0n)), rational(0n));
    if (cmp(left, rational(chem.lowStockBase)) < 0) {
      warn({
        code: "low_stock",
        chemicalId: chem.id,
        message: `${chem.name}: ${formatAmount(left.n / left.d, chem.lowStockDimension)} left after this, below the low-stock mark of ${formatAmount(chem.lowStockBase, chem.lowStockDimension)}.`,
      });
    }
  }
  return { lines, shortfalls, warnings };
}
