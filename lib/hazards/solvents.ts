/**
 * Looking up solvent records by name, synonym or CAS number, in the built-in set plus
 * any records a lab has added (which take precedence over a built-in record with the
 * same name, synonym or CAS number).
 */
import { z } from "zod";
import { AppError, zodIssues } from "../errors/app-error";
import { BUILT_IN_SOLVENTS } from "./solvent-data";
import { solventRecordSchema, type SolventRecord, type SolventRecordInput } from "./solvent-record";

/** A lookup key: lower case, Unicode dashes as "-", without white space. */
export function solventKey(name: string): string {
  return name
    .normalize("NFKC")
    .toLowerCase()
    .replace(/[\u2010-\u2015\u2212]/g, "-")
    .replace(/\s+/g, "");
}

/** A set of solvent records with an index by every name it answers to. */
export class SolventCatalogue {
  private readonly index = new Map<string, SolventRecord>();
  /** Names as given, already looked up (the same few names are asked for again and again). */
  private readonly asked = new Map<string, SolventRecord | undefined>();
  readonly records: readonly SolventRecord[];

  constructor(records: readonly SolventRecord[]) {
    this.records = records;
    // Later records win: lab records are passed after the built-in ones.
    for (const r of records) {
      for (const name of [r.id, r.name, ...r.synonyms, ...(r.cas ? [r.cas] : [])]) {
        this.index.set(solventKey(name), r);
      }
    }
  }

  /** The record a name, synonym or CAS number refers to, or undefined. */
  find(nameOrCas: string): SolventRecord | undefined {
    if (this.asked.has(nameOrCas)) return this.asked.get(nameOrCas);
    const r = this.index.get(solventKey(nameOrCas));
    if (this.asked.size < 10000) this.asked.set(nameOrCas, r);
    return r;
  }

  /**
   * The record a name refers to.
   * @throws AppError invalid_input at `path` when no record answers to the name.
   */
  resolve(nameOrCas: string, path: string): SolventRecord {
    const r = this.find(nameOrCas);
    if (!r) {
      throw AppError.field(
        path,
        `unknown solvent "${nameOrCas}"; known solvents: ${this.records.map((s) => s.name).join(", ")} (a lab can add its own)`,
      );
    }
    return r;
  }
}

let builtIn: SolventCatalogue | undefined;

/** The catalogue of the built-in records only. */
export function builtInCatalogue(): SolventCatalogue {
  builtIn ??= new SolventCatalogue(BUILT_IN_SOLVENTS);
  return builtIn;
}

/** Lab-added records as accepted from callers (validated with `solventRecordSchema`). */
export const labSolventsSchema = z.array(solventRecordSchema).max(500);

/**
 * The built-in records plus a lab's own (validated).
 * @throws AppError invalid_input with paths under `path` (e.g. `labSolvents.0.densityGPerMl`)
 * when a lab record does not validate.
 */
export function solventCatalogue(labSolvents?: unknown, path = "labSolvents"): SolventCatalogue {
  if (labSolvents === undefined || (Array.isArray(labSolvents) && labSolvents.length === 0)) return builtInCatalogue();
  const parsed = labSolventsSchema.safeParse(labSolvents);
  if (!parsed.success) {
    throw new AppError(
      "invalid_input",
      "A lab solvent record is not valid.",
      zodIssues(parsed.error).map((i) => ({ ...i, path: i.path ? `${path}.${i.path}` : path })),
    );
  }
  return new SolventCatalogue([...BUILT_IN_SOLVENTS, ...parsed.data]);
}

/** Finds a solvent by name, synonym or CAS number among the built-in and the given lab records. */
export function findSolvent(nameOrCas: string, labSolvents?: readonly SolventRecordInput[]): SolventRecord | undefined {
  return solventCatalogue(labSolvents).find(nameOrCas);
}
