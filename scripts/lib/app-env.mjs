// The environment the app runs with, derived once for `npm start` and `npm test`.
import { randomBytes } from "node:crypto";
import { mkdirSync, readdirSync, statSync, existsSync } from "node:fs";
import { join } from "node:path";
import { persistentSecret } from "./postgres.mjs";

export function projectRoot() {
  return new URL("../..", import.meta.url).pathname.replace(/\/$/, "");
}

export function secrets(root, name) {
  mkdirSync(`${root}/.data/${name}`, { recursive: true });
  return {
    dbPassword: persistentSecret(`${root}/.data/${name}/db-password`, () => randomBytes(18).toString("base64url")),
    authSecret: persistentSecret(`${root}/.data/${name}/auth-secret`, () => randomBytes(32).toString("base64url")),
  };
}

/** Newest modification time of the files a production build depends on. */
export function newestSourceMtime(root) {
  const dirs = ["app", "components", "lib", "inventory", "models", "public"];
  const files = ["next.config.mjs", "tailwind.config.ts", "postcss.config.mjs", "package-lock.json", "tsconfig.json", "proxy.ts"];
  let newest = 0;
  const walk = (dir) => {
    if (!existsSync(dir)) return;
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const p = join(dir, entry.name);
      if (entry.isDirectory()) walk(p);
      else newest = Math.max(newest, statSync(p).mtimeMs);
    }
  };
  for (const d of dirs) walk(join(root, d));
  for (const f of files) if (existsSync(join(root, f))) newest = Math.max(newest, statSync(join(root, f)).mtimeMs);
  return newest;
}

export function buildIsFresh(root, distDir) {
  const id = join(root, distDir, "BUILD_ID");
  return existsSync(id) && statSync(id).mtimeMs >= newestSourceMtime(root);
}
