import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import type { InventoryChemicalFacts } from "@/lib/chemistry/inventory-facts";
import { preferenceOrder, proposeContainers, type ContainerFacts, type Requirement } from "../availability";
import { loadStockFacts } from "./availability";
import { peroxideIntervalsFor, todayIso } from "./common";

const toNumber = (v: string | null): number | null => (v === null ? null : Number(v));

/**
 * Reads what the inventory records about the chemicals a plan links to (`chemicalId` on
 * its components and solvents) and the container each would be taken from, for
 * `applyInventoryFacts` (lib/chemistry/inventory-facts.ts). Lab-scoped: chemicals of
 * another lab are not found. Reads only.
 *
 * The container is the one the inventory would propose (inventory/availability.ts): with
 * a requirement for the chemical, the first container `proposeContainers` takes it from;
 * without one, the first of the chemical's available, unexpired containers with free
 * stock in the proposal's order (first to expire first, opened before sealed, then the
 * smaller free amount). Null when no container is usable.
 * @throws AppError not_found naming the chemical ids the lab does not have.
 */
export async function planHazardFacts(
  opts: { labId: string; chemicalIds: readonly string[]; requirements?: readonly Requirement[]; today?: string },
  t?: Transaction,
): Promise<Record<string, InventoryChemicalFacts>> {
  const ids = [...new Set(opts.chemicalIds)];
  if (ids.length === 0) return {};
  // Reads only, at READ COMMITTED: the caller's transaction when there is one, else none of
  // its own (a BEGIN and COMMIT would add two round trips to every plan page and give no
  // snapshot the statements would not have anyway).
  const { records: chems, chemicals, containers } = await loadStockFacts(opts.labId, ids, t);
  const missing = ids.filter((id) => !chems.some((c) => c.id === id));
  if (missing.length > 0) {
    throw new AppError("not_found", `No such chemical in this lab: ${missing.join(", ")}.`, missing.map((id) => ({ path: "chemicalId", message: `${id}: no such chemical in this lab` })));
  }
  const today = opts.today ?? todayIso();
  // The peroxide test intervals matter only to a proposal for a requirement (release, availability).
  const intervals = opts.requirements?.length ? await peroxideIntervalsFor(opts.labId, t) : undefined;
  const out: Record<string, InventoryChemicalFacts> = {};
  for (const chem of chems) {
    const facts = chemicals.find((c) => c.id === chem.id)!;
    const own = containers.filter((c) => c.chemicalId === chem.id);
    const requirement = opts.requirements?.find((r) => r.chemicalId === chem.id);
    let chosen: ContainerFacts | undefined;
    if (requirement) {
      const proposal = proposeContainers({ requirements: [requirement], chemicals: [facts], containers: own, today, peroxideIntervals: intervals! });
      const pick = proposal.lines[0]?.picks[0];
      chosen = pick ? own.find((c) => c.id === pick.containerId) : undefined;
    } else {
      chosen = own
        .filter((c) => c.status === "available" && !(c.expiresOn && c.expiresOn < today) && c.amountBase - c.heldBase > 0n)
        .sort(preferenceOrder)[0];
    }
    out[chem.id] = {
      chemicalId: chem.id,
      name: chem.name,
      ghsStatements: [...chem.ghsStatements],
      pyrophoric: chem.pyrophoric,
      waterReactive: chem.waterReactive,
      peroxideClass: chem.peroxideClass,
      physicalState: chem.physicalState,
      formula: chem.formula,
      molarMassGPerMol: toNumber(chem.molarMass),
      densityGPerMl: toNumber(chem.density),
      container: chosen
        ? {
            id: chosen.id,
            barcode: chosen.barcode,
            openedOn: chosen.openedOn,
            receivedOn: chosen.receivedOn,
            peroxideTestedOn: chosen.peroxideTestedOn,
            expiresOn: chosen.expiresOn,
            purityPercent: toNumber(chosen.purityPercent),
            molarityM: chosen.concentrationUnit === "M" ? toNumber(chosen.concentration) : null,
          }
        : null,
    };
  }
  return out;
}
