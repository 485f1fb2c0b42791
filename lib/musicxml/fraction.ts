import type { Fraction } from "./model";

/** Exact arithmetic on fractions of a whole note. Inputs and outputs are reduced, den > 0. */

export const ZERO: Fraction = Object.freeze({ num: 0, den: 1 }) as Fraction;

/** Greatest common divisor of two integers (0 when both are 0). */
export function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) {
    const t = a % b;
    a = b;
    b = t;
  }
  return a;
}

/** Thrown when exact arithmetic would leave the range of safe integers (absurd durations). */
export class FractionRangeError extends Error {}

export function frac(num: number, den = 1): Fraction {
  if (den === 0) throw new FractionRangeError("zero denominator");
  if (den < 0) {
    num = -num;
    den = -den;
  }
  if (!Number.isSafeInteger(num) || !Number.isSafeInteger(den)) throw new FractionRangeError("out of range");
  if (num === 0) return { num: 0, den: 1 };
  const g = gcd(num, den);
  return g === 1 ? { num, den } : { num: num / g, den: den / g };
}

export function add(a: Fraction, b: Fraction): Fraction {
  if (a.den === b.den) return frac(a.num + b.num, a.den);
  const g = gcd(a.den, b.den);
  const l = (a.den / g) * b.den;
  return frac(a.num * (l / a.den) + b.num * (l / b.den), l);
}

export function sub(a: Fraction, b: Fraction): Fraction {
  return add(a, { num: -b.num, den: b.den });
}

export function mul(a: Fraction, b: Fraction): Fraction {
  const g1 = gcd(a.num, b.den) || 1;
  const g2 = gcd(b.num, a.den) || 1;
  return frac((a.num / g1) * (b.num / g2), (a.den / g2) * (b.den / g1));
}

export function div(a: Fraction, b: Fraction): Fraction {
  if (b.num === 0) throw new FractionRangeError("division by zero");
  return mul(a, { num: b.den, den: b.num });
}

export function cmp(a: Fraction, b: Fraction): number {
  if (a.den === b.den) return a.num - b.num;
  // Cross-multiplying can exceed 2^53 for large denominators; the float comparison is exact
  // enough there because equal fractions are caught by the reduced form first.
  if (a.num === b.num && a.den === b.den) return 0;
  const x = a.num * b.den;
  const y = b.num * a.den;
  if (Number.isSafeInteger(x) && Number.isSafeInteger(y)) return x - y;
  return a.num / a.den - b.num / b.den;
}

export function toNumber(a: Fraction): number {
  return a.num / a.den;
}

/** The value of a fraction written "num/den" (as the analysis sends onsets and durations); NaN when it is not one. */
export function valueOfText(text: string): number {
  const [num, den] = text.split("/").map(Number);
  return den > 0 && Number.isFinite(num) ? num / den : Number.NaN;
}

export function toString(a: Fraction): string {
  return `${a.num}/${a.den}`;
}

/**
 * Parses an xs:decimal ("12", "1.5", "-3") exactly. Returns null when the text is not a decimal
 * or has more digits than exact arithmetic can hold.
 */
export function parseDecimal(text: string): Fraction | null {
  // Fast path for the common case, a short run of digits ("2", "480"): no regular expression.
  const len = text.length;
  if (len > 0 && len < 10) {
    let v = 0;
    let i = 0;
    for (; i < len; i++) {
      const c = text.charCodeAt(i) - 48;
      if (c < 0 || c > 9) break;
      v = v * 10 + c;
    }
    if (i === len) return v === 0 ? { num: 0, den: 1 } : { num: v, den: 1 };
  }
  const m = /^\s*([+-]?)(\d*)(?:\.(\d*))?\s*$/.exec(text);
  if (!m || (m[2] === "" && !m[3])) return null;
  const whole = m[2] || "0";
  const decimals = (m[3] ?? "").replace(/0+$/, "");
  if (whole.replace(/^0+/, "").length + decimals.length > 15) return null;
  const num = Number(whole + decimals) * (m[1] === "-" ? -1 : 1);
  return frac(num, 10 ** decimals.length);
}
