import "server-only";
import { Op, type Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { availabilityInputSchema } from "@/inventory/schemas";
import { Chemical, Container } from "@/lib/server/models";
import { proposeContainers, type ChemicalFacts, type ContainerFacts } from "../availability";
import { heldByContainer, peroxideIntervalsFor, todayIso } from "./common";

/**
 * Loads what proposeContainers needs for some chemicals of one lab (tenant in every
 * query), plus the chemical records themselves for callers that need more of them. With
 * `lock` (inside the caller's transaction), the containers of those chemicals are locked
 * for update in id order first — the order reserveStock locks in — so what is held is read
 * after every competing reservation of them has committed or rolled back.
 */
export async function loadStockFacts(labId: string, chemicalIds: readonly string[], t?: Transaction, lock = false): Promise<{ chemicals: ChemicalFacts[]; containers: ContainerFacts[]; records: Chemical[] }> {
  // The chemicals and their containers are read at once (both by the ids asked for, in this lab);
  // a container is kept only with its chemical found in the lab, as when it was read by the chemicals found.
  const [chems, lab] = await Promise.all([
    Chemical.findAll({ where: { labId, id: { [Op.in]: [...chemicalIds] } }, transaction: t }),
    Container.findAll({
      where: { labId, chemicalId: { [Op.in]: [...chemicalIds] } },
      order: [["id", "ASC"]],
      ...(lock && t ? { lock: t.LOCK.UPDATE } : {}),
      transaction: t,
    }),
  ]);
  const found = new Set(chems.map((c) => c.id));
  const boxes = lab.filter((b) => found.has(b.chemicalId));
  const held = await heldByContainer(boxes.map((b) => b.id), t);
  return {
    records: chems,
    chemicals: chems.map((c) => ({
      id: c.id,
      name: c.name,
      molarMass: c.molarMass,
      density: c.density,
      peroxideClass: c.peroxideClass,
      ghsStatements: c.ghsStatements,
      lowStockBase: c.lowStockBase === null ? null : BigInt(c.lowStockBase),
      lowStockDimension: c.lowStockDimension,
    })),
    containers: boxes.map((b) => ({
      id: b.id,
      barcode: b.barcode,
      chemicalId: b.chemicalId,
      dimension: b.dimension,
      amountBase: BigInt(b.amountBase),
      heldBase: held.get(b.id) ?? 0n,
      status: b.status,
      purityPercent: b.purityPercent,
      concentration: b.concentration,
      concentrationUnit: b.concentrationUnit,
      receivedOn: b.receivedOn,
      openedOn: b.openedOn,
      expiresOn: b.expiresOn,
      peroxideTestedOn: b.peroxideTestedOn,
    })),
  };
}

/**
 * Availability for a run sheet's requirements in one lab: proposed containers per
 * requirement, shortfalls per chemical and warnings (inventory/availability.ts). Reads
 * only (inside the caller's transaction `t` when given, so a plan's release sees what it
 * is about to reserve); reserve the proposal with reserveStock. With `lock` the containers
 * are locked first (loadStockFacts), so the proposal stays true until the transaction ends.
 * Amounts in the result are base-unit strings plus display text.
 * @throws AppError invalid_input.
 */
export async function checkAvailability(opts: { labId: string; input: unknown; today?: string; lock?: boolean }, t?: Transaction) {
  const { requirements } = parseOrThrow(availabilityInputSchema, opts.input);
  const facts = await loadStockFacts(opts.labId, [...new Set(requirements.map((r) => r.chemicalId))], t, opts.lock ?? false);
  const proposal = proposeContainers({
    requirements: requirements.map((r) => ({ chemicalId: r.chemicalId, amount: r.amount, unit: r.unit, label: r.label ?? undefined })),
    ...facts,
    today: opts.today ?? todayIso(),
    peroxideIntervals: await peroxideIntervalsFor(opts.labId, t),
  });
  const names = new Map(facts.chemicals.map((c) => [c.id, c.name]));
  return {
    lines: proposal.lines.map((l) => ({
      ...l,
      chemicalName: names.get(l.chemicalId) ?? "unknown chemical",
      picks: l.picks.map((p) => ({ ...p, amountBase: p.amountBase.toString() })),
    })),
    shortfalls: proposal.shortfalls,
    warnings: proposal.warnings,
  };
}
