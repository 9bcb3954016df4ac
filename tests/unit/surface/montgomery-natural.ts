import { EX112 } from "../stats/montgomery-data";

// Montgomery Example 11.2 in natural units: reaction time 80–90 min (x1) and temperature
// 170–180 °F (x2), centre 85 min and 175 °F (the book's natural variables, from memory;
// the coded data are REFERENCE.md §6 [V*]).
export const FACTORS_112 = [
  { name: "time", low: 80, high: 90, unit: "min" },
  { name: "temperature", low: 170, high: 180, unit: "degF" },
];
export const EX112_NATURAL = {
  factors: FACTORS_112,
  runs: EX112.runs.map((r) => ({ coded: { time: r.coded.x1, temperature: r.coded.x2 }, response: r.response })),
};
