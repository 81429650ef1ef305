/**
 * Statics of a simply supported span (any structural analysis text): moments in N·mm at a
 * station x from the start support, for loads in N and N/mm, lengths in mm.
 */

/** A uniform load w over the whole span: M = w x (L − x)/2. */
export function uniformLoadMomentNmm(loadNPerMm: number, spanLengthMm: number, xMm: number): number {
  return (loadNPerMm * xMm * (spanLengthMm - xMm)) / 2;
}

/** A point load P at a: M = P (L − a) x / L for x ≤ a, P a (L − x)/L beyond. */
export function pointLoadMomentNmm(loadN: number, atMm: number, spanLengthMm: number, xMm: number): number {
  return xMm <= atMm ? (loadN * (spanLengthMm - atMm) * xMm) / spanLengthMm : (loadN * atMm * (spanLengthMm - xMm)) / spanLengthMm;
}
