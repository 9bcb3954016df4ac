/**
 * A component's hazard profile: what is fixed about it whatever the run — its GHS
 * statements (its own and its solvent record's), the flags they imply
 * (lib/hazards/hazard-flags.ts) and whether it is protic or aqueous.
 */
import { impliedHazards, normalizeGhsStatement, type PeroxideClass, type PeroxideFormer } from "../hazard-flags";
import type { SolventRecord } from "../solvent-record";

export interface HazardProfile {
  name: string;
  /** Identity within a vial: a solvent record's id, else the name. */
  key: string;
  /** The solvent record it is, if any. */
  record: SolventRecord | undefined;
  ghs: string[];
  pyrophoric: boolean;
  waterReactive: boolean;
  /** "unclassified" when EUH019 is stated without a class. */
  peroxideClass: PeroxideFormer | null;
  protic: boolean;
  aqueous: boolean;
  /** H260/H261/EUH014 statements, and the CMR statements H340/H350/H360 (with suffixes). */
  waterCodes: string[];
  cmrCodes: string[];
}

/** A component as it is in one vial: its profile and its container's dates. */
export interface Material {
  p: HazardProfile;
  openedOn: string | null | undefined;
  peroxideTestedOn: string | null | undefined;
  receivedOn?: string | null | undefined;
  expiresOn?: string | null | undefined;
}

export interface StatedHazards {
  pyrophoric?: boolean | undefined;
  waterReactive?: boolean | undefined;
  peroxideClass?: PeroxideClass | null | undefined;
  protic?: boolean | undefined;
  aqueous?: boolean | undefined;
}

/** The profile of a component from its statements, its stated flags and its solvent record. */
export function profileOf(name: string, statements: readonly string[], flags: StatedHazards, record: SolventRecord | undefined): HazardProfile {
  const ghs = [...new Set([...statements.map(normalizeGhsStatement), ...(record?.ghs.value ?? [])])];
  const h = impliedHazards({
    ghs,
    pyrophoric: flags.pyrophoric,
    waterReactive: flags.waterReactive,
    peroxideClass: flags.peroxideClass ?? record?.peroxideClass?.value ?? null,
  });
  return {
    name,
    key: record ? `solvent:${record.id}` : `name:${name.trim().toLowerCase()}`,
    record,
    ghs,
    pyrophoric: h.pyrophoric,
    waterReactive: h.waterReactive,
    peroxideClass: h.peroxideClass,
    protic: flags.protic ?? record?.protic ?? false,
    aqueous: flags.aqueous ?? record?.aqueous ?? false,
    waterCodes: h.waterCodes,
    cmrCodes: h.cmrCodes,
  };
}

const solventMaterials = new WeakMap<SolventRecord, Material>();

/** A solvent of the vial that is not listed among its components (no container data). */
export function solventMaterial(r: SolventRecord): Material {
  let m = solventMaterials.get(r);
  if (!m) {
    m = { p: profileOf(r.name, [], {}, r), openedOn: undefined, peroxideTestedOn: undefined };
    solventMaterials.set(r, m);
  }
  return m;
}
