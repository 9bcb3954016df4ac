import "server-only";
import type PgBoss from "pg-boss";
import type { ClientBase } from "pg";
import type { Transaction } from "sequelize";

/**
 * pg-boss runs its SQL through `db.executeSql(text, values)`; this one runs it on the
 * connection of a Sequelize transaction, so a job is added in the caller's transaction:
 * it exists only if the flow commits. (Sequelize's own `query` would rewrite pg-boss's
 * `$n` parameters, so the statement goes to the transaction's pg client directly;
 * Sequelize 6 keeps that client on `transaction.connection`.)
 */
export function transactionDb(t: Transaction): PgBoss.Db {
  const client = (t as unknown as { connection?: ClientBase }).connection;
  if (!client || typeof client.query !== "function") {
    throw new Error("This Sequelize transaction has no connection (has it finished?); a job cannot join it.");
  }
  return { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
}
