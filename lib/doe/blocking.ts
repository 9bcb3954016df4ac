/**
 * Blocking a two-level factorial or fraction into 2^b blocks by confounding b
 * interactions (and their generalised interactions) with blocks (Montgomery, Design
 * and Analysis of Experiments, ch. 7). The block words are chosen so that the
 * shortest effect confounded with blocks is as long as possible.
 */
import { AppError } from "../errors/app-error";
import { interactionSign, wordLength } from "./factorial";
import type { SignedWord } from "./fractional";

function spanOf(words: readonly number[]): number[] {
  const out: number[] = [];
  for (let s = 1; s < 1 << words.length; s++) {
    let w = 0;
    for (let j = 0; j < words.length; j++) if ((s >> j) & 1) w ^= words[j]!;
    out.push(w);
  }
  return out;
}

/**
 * Chooses b block words for k factors given the fraction's defining relation (empty
 * for a full factorial). A word's effective length is the shortest in its alias set;
 * the choice maximises the smallest effective length over all 2^b − 1 confounded
 * effects (ties: fewer such effects), among the 40 longest candidates. Throws an
 * invalid-input AppError (path `blocks`) when no choice keeps blocks off the identity.
 */
export function chooseBlockWords(k: number, b: number, defining: readonly SignedWord[]): number[] {
  if (b === 0) return [];
  const group = defining.map((d) => d.word);
  const inGroup = new Set([0, ...group]);
  const effLen = (w: number) => Math.min(wordLength(w), ...group.map((g) => wordLength(w ^ g)));
  const seen = new Set<number>();
  const cands: number[] = [];
  for (let w = 1; w < 1 << k; w++) {
    if (inGroup.has(w)) continue;
    // One representative per alias class.
    const rep = Math.min(w, ...group.map((g) => w ^ g));
    if (seen.has(rep)) continue;
    seen.add(rep);
    cands.push(w);
  }
  cands.sort((x, y) => effLen(y) - effLen(x) || wordLength(y) - wordLength(x) || x - y);
  const pool = cands.slice(0, 40);
  let best: number[] | null = null;
  let bestMin = -1;
  let bestCount = Infinity;
  const choice: number[] = [];
  const rec = (start: number) => {
    if (choice.length === b) {
      const span = spanOf(choice);
      if (span.some((w) => inGroup.has(w))) return;
      const lens = span.map(effLen);
      const mn = Math.min(...lens);
      const cnt = lens.filter((l) => l === mn).length;
      if (mn > bestMin || (mn === bestMin && cnt < bestCount)) {
        best = [...choice];
        bestMin = mn;
        bestCount = cnt;
      }
      return;
    }
    for (let c = start; c < pool.length; c++) {
      choice.push(pool[c]!);
      rec(c + 1);
      choice.pop();
    }
  };
  rec(0);
  if (!best) throw AppError.field("blocks", `cannot split this design into ${2 ** b} blocks`);
  return best;
}

/**
 * The block (1-based) of each coded two-level row: block = 1 + Σ_j 2^j·[word_j = +1],
 * so the run with every factor low, (1), is in block 1.
 */
export function blockOfRow(row: readonly number[], blockWords: readonly number[]): number {
  let b = 0;
  blockWords.forEach((w, j) => {
    if (interactionSign(row, w) > 0) b |= 1 << j;
  });
  return b + 1;
}
