import "server-only";
import { db } from "./db";

/**
 * Server code imports models from here, never from "@/models" directly: importing this
 * module initialises every model on the one connection pool before first use.
 */
db();

export * from "@/models";
