import { z } from 'zod';
import { ringContainsPointMm } from '../geometry/contains';

/**
 * The girder cross-sections of the calculation file (`girder.section`), each a zod schema that
 * is both the validator and the TypeScript type. Lengths in millimetres; x across, y up from
 * the soffit. Cross-checks report the offending key's path with a plain message.
 */

const MUST_BE_POSITIVE = 'must be > 0';
const positiveMm = z.number().positive(MUST_BE_POSITIVE);
const nonNegativeMm = z.number().nonnegative('must be >= 0');
const pointMm = z.tuple([z.number(), z.number()]);

type IssueSink = Pick<z.RefinementCtx, 'addIssue'>;
const report = (ctx: IssueSink, path: (string | number)[], message: string): void =>
  ctx.addIssue({ code: 'custom', path, message });
/** A length for a message, without floating-point noise. */
const mm = (value: number): string => `${Number(value.toFixed(3))} mm`;

/** A solid rectangle. */
export const rectangleSectionSchema = z.strictObject({
  shape: z.literal('rectangle'),
  widthMm: positiveMm,
  depthMm: positiveMm,
});
export type RectangleSection = z.infer<typeof rectangleSectionSchema>;

/** A T-beam: a flange of flangeThicknessMm on top of a web, depthMm overall. */
export const teeSectionSchema = z
  .strictObject({
    shape: z.literal('tee'),
    flangeWidthMm: positiveMm,
    flangeThicknessMm: positiveMm,
    webWidthMm: positiveMm,
    depthMm: positiveMm,
  })
  .superRefine((tee, ctx) => {
    if (tee.flangeThicknessMm >= tee.depthMm) report(ctx, ['flangeThicknessMm'], 'flange must be thinner than the depth');
    if (tee.webWidthMm > tee.flangeWidthMm) report(ctx, ['webWidthMm'], 'web must be no wider than the flange');
  });
export type TeeSection = z.infer<typeof teeSectionSchema>;

/**
 * An I-girder, from the soffit up: bottom flange, a taper running linearly from the bottom
 * flange's width to the web's, the web, a taper from the web's width to the top flange's, and
 * the top flange. A taper height of 0 means no taper.
 */
export const iGirderSectionSchema = z
  .strictObject({
    shape: z.literal('i-girder'),
    topFlangeWidthMm: positiveMm,
    topFlangeThicknessMm: positiveMm,
    topTaperHeightMm: nonNegativeMm,
    webWidthMm: positiveMm,
    bottomTaperHeightMm: nonNegativeMm,
    bottomFlangeWidthMm: positiveMm,
    bottomFlangeThicknessMm: positiveMm,
    depthMm: positiveMm,
  })
  .superRefine((girder, ctx) => {
    const stacked =
      girder.topFlangeThicknessMm + girder.topTaperHeightMm + girder.bottomTaperHeightMm + girder.bottomFlangeThicknessMm;
    if (stacked >= girder.depthMm) {
      report(ctx, ['depthMm'], `depth must exceed the flanges and tapers stacked (${mm(stacked)}) to leave a web`);
    }
    if (girder.webWidthMm > girder.topFlangeWidthMm) report(ctx, ['webWidthMm'], 'web must be no wider than the top flange');
    if (girder.webWidthMm > girder.bottomFlangeWidthMm) report(ctx, ['webWidthMm'], 'web must be no wider than the bottom flange');
  });
export type IGirderSection = z.infer<typeof iGirderSectionSchema>;

/**
 * A solid shape symmetric about x = 0 given by its width at rising heights, linear between
 * points: `[[yMm, widthMm], ...]` from y = 0 at the soffit (bulb-tees and the like).
 */
export const profileSectionSchema = z
  .strictObject({
    shape: z.literal('profile'),
    widthsMm: z.array(z.tuple([z.number(), nonNegativeMm])).min(2, 'a profile needs at least 2 points'),
  })
  .superRefine(({ widthsMm }, ctx) => {
    if (widthsMm[0]![0] !== 0) report(ctx, ['widthsMm', 0, 0], 'the first point must be at y = 0 (the soffit)');
    widthsMm.forEach(([y], i) => {
      if (i > 0 && !(y > widthsMm[i - 1]![0])) report(ctx, ['widthsMm', i, 0], 'y must rise strictly from point to point');
    });
    if (widthsMm.every(([, width]) => width === 0)) report(ctx, ['widthsMm'], 'the profile must have some width');
  });
export type ProfileSection = z.infer<typeof profileSectionSchema>;

/**
 * A rectangle with a rectangular void centred across it, the void's underside voidBottomMm
 * above the soffit, and optional 45° fillets of leg voidFilletMm in the void's four corners.
 */
export const boxSectionSchema = z
  .strictObject({
    shape: z.literal('box'),
    widthMm: positiveMm,
    depthMm: positiveMm,
    voidWidthMm: positiveMm,
    voidDepthMm: positiveMm,
    voidBottomMm: positiveMm,
    voidFilletMm: nonNegativeMm.optional(),
  })
  .superRefine((box, ctx) => {
    if (box.voidWidthMm >= box.widthMm) report(ctx, ['voidWidthMm'], 'void must be narrower than the box');
    if (box.voidBottomMm + box.voidDepthMm >= box.depthMm) {
      report(ctx, ['voidDepthMm'], 'void must end below the top of the box (voidBottomMm + voidDepthMm < depthMm)');
    }
    const filletMm = box.voidFilletMm ?? 0;
    if (2 * filletMm >= Math.min(box.voidWidthMm, box.voidDepthMm)) {
      report(ctx, ['voidFilletMm'], 'fillets must leave a straight part of every void side (2 × voidFilletMm < void width and depth)');
    }
  });
export type BoxSection = z.infer<typeof boxSectionSchema>;

/**
 * A slab with voidCount circular voids of voidDiameterMm, centres at height voidCentreYMm and,
 * across, at widthMm·(i + ½)/voidCount − widthMm/2 for i = 0 … voidCount − 1 (equal spacing,
 * half a spacing from each side).
 */
export const voidedSlabSectionSchema = z
  .strictObject({
    shape: z.literal('voided-slab'),
    widthMm: positiveMm,
    depthMm: positiveMm,
    voidDiameterMm: positiveMm,
    voidCount: z.number().int('must be a whole number').positive(MUST_BE_POSITIVE),
    voidCentreYMm: positiveMm,
  })
  .superRefine((slab, ctx) => {
    const spacingMm = slab.widthMm / slab.voidCount;
    if (slab.voidDiameterMm >= spacingMm) {
      report(
        ctx,
        ['voidDiameterMm'],
        `voids must be narrower than their spacing (widthMm / voidCount = ${mm(spacingMm)})` +
          ' so they neither overlap nor break through the sides',
      );
    }
    const radiusMm = slab.voidDiameterMm / 2;
    if (slab.voidCentreYMm - radiusMm <= 0 || slab.voidCentreYMm + radiusMm >= slab.depthMm) {
      report(ctx, ['voidCentreYMm'], 'voids must lie inside the slab depth (voidCentreYMm ± voidDiameterMm / 2)');
    }
  });
export type VoidedSlabSection = z.infer<typeof voidedSlabSectionSchema>;

/**
 * A double-tee: a flange of flangeWidthMm × flangeThicknessMm on two stems whose centres are
 * stemSpacingMm apart, each tapering linearly from stemBottomWidthMm at the soffit to
 * stemTopWidthMm under the flange.
 */
export const doubleTeeSectionSchema = z
  .strictObject({
    shape: z.literal('double-tee'),
    flangeWidthMm: positiveMm,
    flangeThicknessMm: positiveMm,
    stemSpacingMm: positiveMm,
    stemTopWidthMm: positiveMm,
    stemBottomWidthMm: positiveMm,
    depthMm: positiveMm,
  })
  .superRefine((section, ctx) => {
    if (section.flangeThicknessMm >= section.depthMm) report(ctx, ['flangeThicknessMm'], 'flange must be thinner than the depth');
    const widestStemMm = Math.max(section.stemTopWidthMm, section.stemBottomWidthMm);
    if (widestStemMm >= section.stemSpacingMm) report(ctx, ['stemSpacingMm'], 'stems must not touch: spacing must exceed the stem width');
    if (section.stemSpacingMm + widestStemMm > section.flangeWidthMm) {
      report(ctx, ['stemSpacingMm'], 'stems must lie under the flange (stemSpacingMm + stem width <= flangeWidthMm)');
    }
  });
export type DoubleTeeSection = z.infer<typeof doubleTeeSectionSchema>;

/** A custom outline `[[x, y], ...]` with optional holes, y = 0 at the soffit. */
export const polygonSectionSchema = z
  .strictObject({
    shape: z.literal('polygon'),
    pointsMm: z.array(pointMm).min(3, 'a polygon needs at least 3 points'),
    holesMm: z.array(z.array(pointMm).min(3, 'a hole needs at least 3 points')).optional(),
  })
  .superRefine(({ pointsMm, holesMm = [] }, ctx) => {
    if (!isSoundRing(pointsMm, ['pointsMm'], 'outline', ctx)) return;
    const lowestYMm = Math.min(...pointsMm.map(([, y]) => y));
    if (lowestYMm !== 0) report(ctx, ['pointsMm'], `the lowest point must be at y = 0 (the soffit), not ${lowestYMm}`);
    holesMm.forEach((hole, h) => {
      if (!isSoundRing(hole, ['holesMm', h], 'hole', ctx)) return;
      const outside = hole.findIndex((point) => ringContainsPointMm(point, pointsMm) !== 'inside');
      if (outside >= 0) report(ctx, ['holesMm', h, outside], 'hole points must lie inside the outline');
    });
  });
export type PolygonSection = z.infer<typeof polygonSectionSchema>;

type Ring = readonly (readonly [number, number])[];

/** Reports a ring that encloses no area or crosses itself; too few points are reported by the length check. */
function isSoundRing(ring: Ring, path: (string | number)[], name: string, ctx: IssueSink): boolean {
  if (ring.length < 3) return false;
  if (doubleArea(ring) === 0) report(ctx, path, `the ${name} must enclose some area`);
  else if (crossesItself(ring)) report(ctx, path, `the ${name} must not cross itself`);
  else return true;
  return false;
}

function doubleArea(ring: Ring): number {
  return ring.reduce((sum, [x, y], i) => {
    const [xNext, yNext] = ring[(i + 1) % ring.length]!;
    return sum + x * yNext - xNext * y;
  }, 0);
}

/** True when two edges that share no end cross properly (each straddles the other's line). */
function crossesItself(ring: Ring): boolean {
  const n = ring.length;
  const turn = (a: readonly number[], b: readonly number[], c: readonly number[]) =>
    Math.sign((b[0]! - a[0]!) * (c[1]! - a[1]!) - (b[1]! - a[1]!) * (c[0]! - a[0]!));
  for (let i = 0; i < n; i++) {
    for (let j = i + 2; j < n; j++) {
      if (i === 0 && j === n - 1) continue; // neighbours across the closing edge
      const [a, b, c, d] = [ring[i]!, ring[(i + 1) % n]!, ring[j]!, ring[(j + 1) % n]!];
      if (turn(a, b, c) * turn(a, b, d) < 0 && turn(c, d, a) * turn(c, d, b) < 0) return true;
    }
  }
  return false;
}


/** Any girder section of the calculation file, told apart by `shape`. */
export const sectionShapeSchema = z.discriminatedUnion('shape', [
  rectangleSectionSchema,
  teeSectionSchema,
  iGirderSectionSchema,
  profileSectionSchema,
  boxSectionSchema,
  voidedSlabSectionSchema,
  doubleTeeSectionSchema,
  polygonSectionSchema,
]);
export type SectionShape = z.infer<typeof sectionShapeSchema>;
