/**
 * `vapor-pressure` verb (the README): `{ "solvent": "tetrahydrofuran",
 * "temperatureC": 120 }` (name, synonym or CAS number; optional `labSolvents`) →
 * `{ bar, method, source, inRange, … }`.
 */
import { z } from "zod";
import { parseOrThrow } from "../../errors/app-error";
import { solventRecordSchema } from "../../hazards/solvent-record";
import { vaporPressure } from "../../hazards/vapor-pressure";

const inputSchema = z.object({
  solvent: z.string().min(1).max(200),
  temperatureC: z.number().gt(-273.15, "temperature must be above absolute zero (−273.15 °C)").max(3000),
  labSolvents: z.array(solventRecordSchema).max(500).optional(),
});

export function run(input: unknown): unknown {
  const v = parseOrThrow(inputSchema, input);
  const r = vaporPressure(v.solvent, v.temperatureC, v.labSolvents);
  return {
    bar: r.bar,
    method: r.method,
    source: r.source,
    inRange: r.inRange,
    solvent: r.solvent,
    tag: r.tag,
    validRangeC: r.validRangeK ? [r.validRangeK[0] - 273.15, r.validRangeK[1] - 273.15] : null,
  };
}
