/**
 * The correctly rounded double of a decimal with a long mantissa (17 to 20 digits, above what
 * Clinger's fast path in csvCursor.ts holds exactly) divided by 10^f, f = 0..22: what a solver
 * writes for "full precision" (17 significant digits, the shortest text that round-trips a
 * double). Returns NaN when it cannot decide, and the caller then asks
 * Number(); the result is never a different double from Number()'s.
 *
 * How (all in doubles, no BigInt, no allocation):
 * 1. The reader hands the mantissa x = hi·10^k + lo in two parts it accumulated exactly (hi below
 *    9·10^15 < 2^53; lo the k ≤ 4 digits after it). x is held exactly as a sum xh + xl of two
 *    doubles: hi·10^k is split into (a·10^k)·2^25 + b·10^k with a < 2^28, b < 2^25, each product
 *    below 2^42 and so exact, then Knuth's TwoSum gives xh = fl(x) and its exact error xl.
 * 2. q1 = fl(xh / p), p = 10^f (exact for f ≤ 22), and the residual x − q1·p from Dekker's exact
 *    product q1·p = th + tl (Veltkamp splitting, no fused multiply-add needed); xh − th is exact
 *    (Sterbenz: th is within a few units of xh), the two other steps round by at most 2^-53 of
 *    values below 3 units of xh, so q2 = residual / p is within about 2^-48 ulp(q1) of its true
 *    value (Dekker, "A floating-point technique for extending the available precision", Numer.
 *    Math. 18 (1971); the error-free sum and product as in Shewchuk, "Adaptive precision
 *    floating-point arithmetic", DCG 18 (1997)).
 * 3. s = fl(q1 + q2) with its exact error e (Fast2Sum, |q2| ≤ 1.5 ulp(q1) ≤ |q1|). The true
 *    quotient is s + e + (an error below 2^-48 ulp). s is the correctly rounded result unless
 *    s + e lies within that error of a midpoint between s and a neighbour: then NaN (the margin
 *    used is 2^-40 ulp(s), so a decimal within about 10^-12 of an ulp of a tie is sent to
 *    Number(); random full-precision text essentially never is). Below a power of two the
 *    neighbour is half an ulp away, and the test uses that half.
 */

/** Exact powers of ten 10^0..10^22. */
const POW10 = new Float64Array(23)
for (let i = 0, p = 1; i < 23; i++, p *= 10) POW10[i] = p

/** 2^25 and Veltkamp's splitter 2^27 + 1. */
const TWO25 = 33554432
const SPLITTER = 134217729

// Bit views of one double, for its exponent (the unit in the last place) and the power-of-two test.
const F64 = new Float64Array(1)
const U32 = new Uint32Array(F64.buffer)
/** Index of the high word (sign, exponent, top of the fraction) in U32. */
const HI = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0
const LO = 1 - HI

/**
 * The double nearest (hi·10^k + lo) / 10^f: `hi` the leading digits (an integer below 9·10^15),
 * `lo` the k = 1..4 digits after them, f = 0..22. NaN when k or f is outside that range or the
 * rounding cannot be decided here.
 */
export function longDecimalQuotient(hi: number, lo: number, k: number, f: number): number {
  if (k < 1 || k > 4 || f < 0 || f > 22) return NaN
  const P = POW10[k]
  // --- x = hi·P + lo exactly as xh + xl ---
  const a = Math.floor(hi / TWO25)
  const b = hi - a * TWO25
  const s1 = a * P * TWO25
  const s2 = b * P + lo
  const xh = s1 + s2
  const bv = xh - s1
  const xl = (s1 - (xh - bv)) + (s2 - bv)
  // An integer: fl(x) is the rounded sum itself.
  if (f === 0) return xh
  // --- q1 = fl(xh / p) and the residual x − q1·p ---
  const p = POW10[f]
  const q1 = xh / p
  let c = SPLITTER * q1
  const qh = c - (c - q1), ql = q1 - qh
  c = SPLITTER * p
  const ph = c - (c - p), pl = p - ph
  const th = q1 * p
  const tl = ((qh * ph - th) + qh * pl + ql * ph) + ql * pl
  const q2 = (((xh - th) - tl) + xl) / p
  // --- s = fl(q1 + q2), e its exact error; decide s or refuse ---
  const s = q1 + q2
  const e = q2 - (s - q1)
  F64[0] = s
  const high = U32[HI]
  const biased = (high >>> 20) & 0x7ff
  // Far from our range (tiny, huge or not finite): let Number() decide.
  if (biased <= 60 || biased >= 2000) return NaN
  U32[HI] = (biased - 52) << 20
  U32[LO] = 0
  const ulp = F64[0]
  const margin = ulp * 9.094947017729282e-13 // 2^-40
  if (e >= 0) return e < ulp / 2 - margin ? s : NaN
  // Below a power of two (fraction bits all zero) the next double down is half an ulp away.
  F64[0] = s
  const below = (U32[HI] & 0xfffff) === 0 && U32[LO] === 0 ? ulp / 2 : ulp
  return -e < below / 2 - margin ? s : NaN
}
