import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { locationInputSchema } from "@/inventory/schemas";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Location } from "@/lib/server/models";
import { uniqueToConflict } from "./common";

/** The lab's storage locations, by name. */
export async function listLocations(opts: { labId: string }, t?: Transaction) {
  const rows = await Location.findAll({ where: { labId: opts.labId }, order: [["name", "ASC"]], transaction: t });
  return rows.map((l) => ({ id: l.id, name: l.name, notes: l.notes }));
}

/** Adds a storage location (names unique per lab), in the caller's transaction `t` when given. Audited. @throws AppError invalid_input, conflict. */
export async function createLocation(opts: { labId: string; actorUserId: string; input: unknown }, t?: Transaction) {
  const v = parseOrThrow(locationInputSchema, opts.input);
  return inTransaction(t, async (t) => {
    const l = await Location.create({ labId: opts.labId, name: v.name, notes: v.notes }, { transaction: t }).catch((e: unknown) => uniqueToConflict(e, "name", `There is already a location called ${v.name}.`));
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "location.created", entityType: "location", entityId: l.id, after: v }, t);
    return { id: l.id, name: l.name, notes: l.notes };
  });
}
