import "server-only";
import pg from "pg";
import { Sequelize, type Transaction } from "sequelize";
import { initModels } from "@/models";
import { serverEnv } from "./env";

/**
 * The one database connection pool of the process, with every model initialised on it.
 * The pool lives on globalThis (one per process, surviving hot reloads); the model classes
 * are initialised once per copy of this module, because the production build may bundle
 * the models into more than one chunk.
 */
const globalForDb = globalThis as unknown as { tarelineSequelize?: Sequelize };
let modelsReady = false;

export function db(): Sequelize {
  if (!globalForDb.tarelineSequelize) {
    globalForDb.tarelineSequelize = new Sequelize(serverEnv().DATABASE_URL, {
      dialect: "postgres",
      dialectModule: pg,
      logging: false,
      pool: { max: 10, min: 0, idle: 10_000 },
    });
  }
  if (!modelsReady) {
    initModels(globalForDb.tarelineSequelize);
    modelsReady = true;
  }
  return globalForDb.tarelineSequelize;
}

/** Runs `fn` in one transaction (committed when it resolves, rolled back when it throws). */
export function transaction<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  return db().transaction(fn);
}

/**
 * Runs `fn` in the caller's transaction `t` when one is given (the caller commits or rolls
 * back the whole flow), or in a transaction of its own otherwise. Every domain operation
 * takes the caller's transaction as its optional last parameter and runs through this, so
 * flows such as "release a plan and reserve its stock" commit or roll back as one.
 */
export function inTransaction<T>(t: Transaction | undefined, fn: (t: Transaction) => Promise<T>): Promise<T> {
  return t ? fn(t) : db().transaction(fn);
}
