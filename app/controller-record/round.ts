// Rounding of derived values: halves away from zero, on the value as a decimal number.
// A float product such as 2.8 * 24 = 67.19999999999999 is first read to 15 significant digits (67.2000...),
// so a person's hand arithmetic and the rounded value agree (decision 120).

/** `x` rounded to `decimals` places, halves away from zero. Non-finite values pass through. */
export function roundHalfAway(x: number, decimals: number): number {
  if (!Number.isFinite(x) || x === 0) return x;
  const sign = x < 0 ? -1 : 1;
  // "d.dddddddddddddde±E": 15 significant digits.
  const [mantissa, exp] = Math.abs(x).toExponential(14).split("e");
  const digits = mantissa.replace(".", "");
  const kept = Number(exp) + 1 + decimals; // digits left of the rounding position
  if (kept >= digits.length) return sign * Number(`${digits}e${Number(exp) - 14}`);
  if (kept < 0) return 0;
  let whole = kept === 0 ? 0 : Number(digits.slice(0, kept));
  if (digits.charCodeAt(kept) >= 53 /* "5" */) whole += 1;
  return whole === 0 ? 0 : (sign * whole) / 10 ** decimals;
}
