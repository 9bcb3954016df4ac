import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { Chemical, Lab, User } from "@/lib/server/models";

/** The demo lab and its members (seeders/20261201000100-demo-labs-and-members.cjs). */
export const DEMO_LAB_SLUG = "kestrel-bay";
export const DEMO_MEMBERS = {
  chemist: "chemist@kestrelbay.example",
  safety: "safety@kestrelbay.example",
  stockkeeper: "stock@kestrelbay.example",
  admin: "admin@kestrelbay.example",
  viewer: "viewer@kestrelbay.example",
} as const;
export type DemoMember = keyof typeof DEMO_MEMBERS;
/**
 * Every demo account's password (seeders/20261201000100-demo-labs-and-members.cjs hashes it;
 * README "Demo accounts" tells people): the demo's e-signatures are signed with it, through
 * the same password check as any reviewer's.
 */
export const DEMO_PASSWORD = "tareline-demo";

/**
 * What a demo step works with: the demo lab, the ids of its five members by role, the lab's
 * chemicals by catalogue name, and records — the ids an earlier step made, under the names it
 * gave them (`remember` in that step, `recall` in a later one; kept in `demo_steps.records`).
 */
export interface DemoContext {
  lab: { id: string; slug: string };
  users: Record<DemoMember, string>;
  /** The id of the demo lab's chemical with this catalogue name (exactly as seeded). */
  chemicalId(name: string, t: Transaction): Promise<string>;
  /** Records an id under a name for later steps (unique across the demo). */
  remember(key: string, id: string): void;
  /** An id an earlier step (or this one) remembered. */
  recall(key: string): string;
  log(message: string): void;
}

/** The demo lab and its members, or null when the database has no demo lab (the seeders did not run). */
export async function findDemoLab(): Promise<{ lab: { id: string; slug: string }; users: Record<DemoMember, string> } | null> {
  const lab = await Lab.findOne({ where: { slug: DEMO_LAB_SLUG }, attributes: ["id", "slug"] });
  if (!lab) return null;
  const users = {} as Record<DemoMember, string>;
  for (const [role, email] of Object.entries(DEMO_MEMBERS) as Array<[DemoMember, string]>) {
    const u = await User.findOne({ where: { email }, attributes: ["id"] });
    if (!u) throw new Error(`The demo lab has no member ${email}: the demo needs the demo seeders.`);
    users[role] = u.id;
  }
  return { lab: { id: lab.id, slug: lab.slug }, users };
}

/** A step's context over the records of the steps applied so far; `own` collects what this step remembers. */
export function demoContext(base: { lab: { id: string; slug: string }; users: Record<DemoMember, string> }, known: Map<string, string>, own: Record<string, string>, log: (m: string) => void): DemoContext {
  return {
    ...base,
    async chemicalId(name, t) {
      const c = await Chemical.findOne({ where: { labId: base.lab.id, name }, attributes: ["id"], transaction: t });
      if (!c) throw new AppError("not_found", `The demo lab has no chemical named "${name}" (seeders/20261201001000-demo-inventory.cjs).`);
      return c.id;
    },
    remember(key, id) {
      if (known.has(key) || key in own) throw new Error(`The demo record "${key}" exists already: give it another name.`);
      own[key] = id;
    },
    recall(key) {
      const id = own[key] ?? known.get(key);
      if (id === undefined) throw new Error(`No demo record "${key}": the step that makes it must come first (lower number).`);
      return id;
    },
    log,
  };
}
