import "server-only";
import pg from "pg";
import { Sequelize, type Transaction } from "sequelize";
import { initModels } from "@/models";
import { serverEnv } from "./env";

/** The one database connection pool of the process, with every model initialised on it. */
const globalForDb = globalThis as unknown as { tarelineSequelize?: Sequelize };

export function db(): Sequelize {
  if (!globalForDb.tarelineSequelize) {
    const sequelize = new Sequelize(serverEnv().DATABASE_URL, {
      dialect: "postgres",
      dialectModule: pg,
      logging: false,
      pool: { max: 10, min: 0, idle: 10_000 },
    });
    initModels(sequelize);
    globalForDb.tarelineSequelize = sequelize;
  }
  return globalForDb.tarelineSequelize;
}

/** Runs `fn` in one transaction (committed when it resolves, rolled back when it throws). */
export function transaction<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  return db().transaction(fn);
}
