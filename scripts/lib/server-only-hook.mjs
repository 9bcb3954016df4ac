// A Node module hook for scripts that run Tareline's server operations outside Next.js (the
// demo, lib/demo/run.ts): the `server-only` marker package resolves to an empty module, as
// it does on Next's server. (`--conditions=react-server` would do that too, but it also
// changes what `next/headers` resolves to, and audit() reads the request's headers.)
//
//   node --import ./scripts/lib/server-only-hook.mjs --import tsx lib/demo/run.ts
import { register } from "node:module";

const hooks = `export async function resolve(specifier, context, next) {
  if (specifier === "server-only") return { url: "data:text/javascript,export{}", shortCircuit: true };
  return next(specifier, context);
}`;
register(`data:text/javascript,${encodeURIComponent(hooks)}`);
