/**
 * Exact rational arithmetic on BigInt, for stock amounts. Amounts are stored as integer
 * base units (µg, nL); conversions through molar mass, density or concentration are done
 * exactly here and rounded once, at the end, in a stated direction — never as drifting
 * binary floats.
 */

/** A rational number n/d with d > 0, kept in lowest terms. */
export interface Rational {
  readonly n: bigint;
  readonly d: bigint;
}

function gcd(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

/** Builds n/d in lowest terms. @throws RangeError when d is zero. */
export function rational(n: bigint, d: bigint = 1n): Rational {
  if (d === 0n) throw new RangeError("division by zero");
  if (d < 0n) [n, d] = [-n, -d];
  const g = gcd(n, d) || 1n;
  return { n: n / g, d: d / g };
}

const DECIMAL = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/;
/** The largest decimal exponent and text length parseDecimal accepts. */
const MAX_EXPONENT = 1000;
const MAX_DECIMAL_TEXT = 1000;

/**
 * Parses a decimal number written as a string ("12.5", "-0.003", "1e-7") or a finite JS
 * number (through its shortest round-trip decimal form) into an exact rational.
 * @throws RangeError for anything that is not a finite decimal number, or one whose
 *   exponent or text is beyond MAX_EXPONENT / MAX_DECIMAL_TEXT.
 */
export function parseDecimal(value: string | number): Rational {
  if (typeof value === "number" && !Number.isFinite(value)) throw new RangeError(`not a finite number: ${value}`);
  const text = String(value).trim().replace(/_/g, "");
  const m = DECIMAL.exec(text);
  if (!m || (m[2] === "" && (m[3] ?? "") === "")) throw new RangeError(`not a decimal number: "${text}"`);
  const sign = m[1] === "-" ? -1n : 1n;
  const intPart = m[2] ?? "";
  const frac = m[3] ?? "";
  const exp = Number(m[4] ?? "0");
  // A last guard against work without bound ("1e10000000" would build a ten-million-digit
  // BigInt); the schemas (inventory/schemas.ts) refuse such text long before it gets here.
  if (Math.abs(exp) > MAX_EXPONENT || text.length > MAX_DECIMAL_TEXT) throw new RangeError(`decimal out of range: "${text.slice(0, 40)}"`);
  let n = BigInt((intPart + frac) || "0") * sign;
  let d = 10n ** BigInt(frac.length);
  if (exp > 0) n *= 10n ** BigInt(exp);
  else if (exp < 0) d *= 10n ** BigInt(-exp);
  return rational(n, d);
}

export const add = (a: Rational, b: Rational): Rational => rational(a.n * b.d + b.n * a.d, a.d * b.d);
export const sub = (a: Rational, b: Rational): Rational => rational(a.n * b.d - b.n * a.d, a.d * b.d);
export const mul = (a: Rational, b: Rational): Rational => rational(a.n * b.n, a.d * b.d);
/** a / b. @throws RangeError when b is zero. */
export const div = (a: Rational, b: Rational): Rational => rational(a.n * b.d, a.d * b.n);
/** Compares: negative, zero or positive as a <, =, > b. */
export const cmp = (a: Rational, b: Rational): number => {
  const x = a.n * b.d - b.n * a.d;
  return x < 0n ? -1 : x > 0n ? 1 : 0;
};
export const min = (a: Rational, b: Rational): Rational => (cmp(a, b) <= 0 ? a : b);
export const isZero = (a: Rational): boolean => a.n === 0n;

/** The smallest integer ≥ x (round up: never reserve or report less than needed). */
export function ceil(x: Rational): bigint {
  const q = x.n / x.d;
  return x.n % x.d === 0n || x.n < 0n ? q : q + 1n;
}

/** The largest integer ≤ x. */
export function floor(x: Rational): bigint {
  const q = x.n / x.d;
  return x.n % x.d === 0n || x.n > 0n ? q : q - 1n;
}

/**
 * Writes x as a decimal string with at most `maxDigits` fraction digits (rounded half
 * away from zero), trailing zeros removed: toDecimalString(rational(1n, 3n), 4) = "0.3333".
 */
export function toDecimalString(x: Rational, maxDigits = 6): string {
  const scale = 10n ** BigInt(maxDigits);
  const neg = x.n < 0n;
  const absN = neg ? -x.n : x.n;
  const scaled = (absN * scale * 2n + x.d) / (2n * x.d); // round half up on the magnitude
  const int = scaled / scale;
  let frac = (scaled % scale).toString().padStart(maxDigits, "0").replace(/0+$/, "");
  if (maxDigits === 0) frac = "";
  const body = frac ? `${int}.${frac}` : `${int}`;
  return neg && scaled !== 0n ? `-${body}` : body;
}

/** x as a JS number (for display and JSON output only; never fed back into stock arithmetic). */
export function toNumber(x: Rational): number {
  return Number(toDecimalString(x, 12));
}
