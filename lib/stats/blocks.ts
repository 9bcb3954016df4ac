/**
 * Block terms for several plans (or days, batches) analysed together (Montgomery,
 * Design and Analysis of Experiments, §11.4 on blocking response surface designs; the
 * block effects are nuisance terms, not factors of the surface). Blocks enter as B − 1
 * extra columns in sum-to-zero ("effects") coding: block j < B has +1 in column j, the
 * last block −1 in every column, others 0 (Montgomery, ch. 3, the effects model with
 * Σ τᵢ = 0; from memory). Then the intercept is the unweighted average over the blocks, and a
 * prediction with the block columns at zero is the surface with the blocks averaged out.
 */

/** The block coding of a set of runs. */
export interface BlockCoding {
  /** Block labels in order of first appearance; the last one carries −1 in every column. */
  labels: string[];
  /** The block (index into labels) of each run. */
  blockOf: number[];
  /** Runs per block. */
  sizes: number[];
}

/** Labels each run's block; a single block (or none given) gives one label and no columns. */
export function blockCoding(labels: readonly (string | null)[]): BlockCoding {
  const order: string[] = [];
  const index = new Map<string, number>();
  const blockOf = labels.map((l) => {
    const key = l ?? "";
    let i = index.get(key);
    if (i === undefined) {
      i = order.length;
      index.set(key, i);
      order.push(key);
    }
    return i;
  });
  const sizes = order.map(() => 0);
  for (const b of blockOf) sizes[b]!++;
  return { labels: order, blockOf, sizes };
}

/**
 * The between-block sum of squares Σ_b n_b(ȳ_b − ȳ)² on B − 1 degrees of freedom:
 * what the intercept and block columns alone explain (blocks entered first).
 */
export function blockSumOfSquares(coding: BlockCoding, y: readonly number[]): number {
  const sums = coding.sizes.map(() => 0);
  y.forEach((v, i) => (sums[coding.blockOf[i]!]! += v));
  const mean = y.reduce((a, b) => a + b, 0) / y.length;
  return coding.sizes.reduce((acc, nb, b) => acc + nb * (sums[b]! / nb - mean) ** 2, 0);
}
