/**
 * Tareline's engine command line (its contract is in the README):
 *
 *     npm run -s cli -- <verb> < input.json > output.json
 *
 * Reads one JSON document on stdin, writes one JSON document on stdout.
 * Exit 0 success; exit 2 invalid input (nothing done); exit 1 internal error.
 * Each verb lives in `lib/cli/verbs/<verb>.ts` and exports `run(input: unknown)`.
 */
import { AppError, errorBody } from "../errors/app-error";
import { VERBS, type VerbName } from "./verbs";

function readStdin(): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    process.stdin.on("data", (chunk: Buffer) => chunks.push(chunk));
    process.stdin.on("end", () => resolve(Buffer.concat(chunks).toString("utf8")));
    process.stdin.on("error", reject);
  });
}

function write(doc: unknown): Promise<void> {
  return new Promise((resolve) => {
    process.stdout.write(JSON.stringify(doc, null, 2) + "\n", () => resolve());
  });
}

export async function main(argv: string[]): Promise<number> {
  const verb = argv[0];
  try {
    if (!verb || !(verb in VERBS)) {
      throw new AppError(
        "invalid_input",
        `Unknown verb ${verb ? `"${verb}"` : "(none)"}; expected one of: ${Object.keys(VERBS).join(", ")}.`,
        [{ path: "verb", message: "unknown verb" }],
      );
    }
    const text = await readStdin();
    let input: unknown;
    try {
      input = text.trim() === "" ? {} : JSON.parse(text);
    } catch (e) {
      throw new AppError("invalid_input", `Standard input is not valid JSON: ${(e as Error).message}`, [
        { path: "", message: "not valid JSON" },
      ]);
    }
    const verbModule = await VERBS[verb as VerbName]();
    const output = await verbModule.run(input);
    await write(output);
    return 0;
  } catch (error) {
    const body = errorBody(error);
    await write({ error: { message: body.error.message, issues: body.error.issues } });
    const code = error instanceof AppError ? error.code : "internal";
    return code === "invalid_input" || code === "infeasible" ? 2 : 1;
  }
}

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
