// Montgomery, Example 11.2 (CCD, k = 2, α = √2, 5 centre points), REFERENCE.md §6 [V*];
// the fit values there are [C], computed with α = √2 exactly (the book prints 1.414).
const A = Math.SQRT2;
const PTS112: [number, number, number][] = [
  [-1, -1, 76.5], [-1, 1, 77.0], [1, -1, 78.0], [1, 1, 79.5],
  [0, 0, 79.9], [0, 0, 80.3], [0, 0, 80.0], [0, 0, 79.7], [0, 0, 79.8],
  [A, 0, 78.4], [-A, 0, 75.6], [0, A, 78.5], [0, -A, 77.0],
];
/** Example 11.2 as a `fit` input (factors in coded units). */
export const EX112 = {
  factors: [
    { name: "x1", low: -1, high: 1 },
    { name: "x2", low: -1, high: 1 },
  ],
  runs: PTS112.map(([x1, x2, y]) => ({ coded: { x1, x2 }, response: y })),
};

// Montgomery, Example 6.2 (unreplicated 2^4, filtration rate), responses in standard
// order, A fastest (REFERENCE.md §6, [V]).
export const Y62 = [45, 71, 48, 65, 68, 60, 80, 65, 43, 100, 45, 104, 75, 86, 70, 96];
export const F4 = ["A", "B", "C", "D"].map((name) => ({ name, low: -1, high: 1 }));
export const RUNS62 = Y62.map((y, r) => ({
  coded: { A: r & 1 ? 1 : -1, B: r & 2 ? 1 : -1, C: r & 4 ? 1 : -1, D: r & 8 ? 1 : -1 },
  response: y,
}));
