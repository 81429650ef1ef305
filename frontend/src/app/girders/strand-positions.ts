import type { PolygonMm, StrandRow } from '@spanledger/shared';

/** What placing and drawing a row needs of a calculation-file strand row. */
export type DrawnStrandRow = Pick<StrandRow, 'id' | 'yMm' | 'count' | 'strandDiameterMm'> & { readonly xMm?: readonly number[] };

/** A strand's centre in section coordinates: x across, y up from the soffit. */
export interface StrandPositionMm {
  readonly xMm: number;
  readonly yMm: number;
}

/** A stretch of concrete across the section at one height, left edge to right edge. */
type SpanAcrossMm = readonly [leftMm: number, rightMm: number];

/**
 * Where the strands of a row sit, in strand-index order (0…count−1). A row's own `xMm` is used
 * when it names every strand; otherwise the strands are spread evenly over the concrete at the
 * row's height, one strand diameter of clear cover from each concrete edge. Where the height
 * cuts the section into several stretches (webs of a box, stems of a double-tee) each gets a
 * share of the strands in proportion to its width, spread evenly within it, left to right.
 * A height with no concrete spreads the strands over the section's full width, so a misplaced
 * row shows as strands drawn outside the concrete.
 */
export function strandPositionsMm(polygons: readonly PolygonMm[], row: DrawnStrandRow): StrandPositionMm[] {
  if (row.xMm !== undefined && row.xMm.length === row.count) return row.xMm.map((xMm) => ({ xMm, yMm: row.yMm }));
  const concrete = concreteAcrossMm(polygons, row.yMm);
  const stretches = concrete.length > 0 ? concrete : [overallWidthMm(polygons)];
  // Clear cover of one diameter puts the centre one and a half diameters in from the edge.
  const usable = stretches.map((stretch) => insetStretch(stretch, 1.5 * row.strandDiameterMm));
  const shares = shareByWidth(row.count, usable.map(([left, right]) => right - left));
  return usable.flatMap((stretch, index) => spreadOver(stretch, shares[index]!).map((xMm) => ({ xMm, yMm: row.yMm })));
}

/**
 * The stretches of concrete a horizontal line at `yMm` crosses, left to right (outlines and
 * holes by the even–odd rule). Edges count from their lower end, so at the height of a step the
 * width just above it is taken, and the very top of a section has no concrete.
 */
export function concreteAcrossMm(polygons: readonly PolygonMm[], yMm: number): SpanAcrossMm[] {
  return polygons
    .flatMap((polygon) => {
      const crossings = [polygon.outer, ...polygon.holes].flatMap((ring) => ringCrossingsMm(ring, yMm)).sort((a, b) => a - b);
      const stretches: SpanAcrossMm[] = [];
      for (let i = 0; i + 1 < crossings.length; i += 2) stretches.push([crossings[i]!, crossings[i + 1]!]);
      return stretches;
    })
    .sort((a, b) => a[0] - b[0]);
}

function ringCrossingsMm(ring: PolygonMm['outer'], yMm: number): number[] {
  return ring.flatMap(([xA, yA], i) => {
    const [xB, yB] = ring[(i + 1) % ring.length]!;
    const crosses = (yA <= yMm && yMm < yB) || (yB <= yMm && yMm < yA);
    return crosses ? [xA + ((yMm - yA) * (xB - xA)) / (yB - yA)] : [];
  });
}

function overallWidthMm(polygons: readonly PolygonMm[]): SpanAcrossMm {
  const xs = polygons.flatMap((polygon) => polygon.outer.map(([x]) => x));
  return [Math.min(...xs), Math.max(...xs)];
}

/** A stretch narrower than the two insets shrinks to its middle. */
function insetStretch([left, right]: SpanAcrossMm, insetMm: number): SpanAcrossMm {
  return right - left >= 2 * insetMm ? [left + insetMm, right - insetMm] : [(left + right) / 2, (left + right) / 2];
}

/** Whole shares of `count` in proportion to the widths, by the largest remainder; equal shares when every width is nil. */
function shareByWidth(count: number, widthsMm: readonly number[]): number[] {
  const totalMm = widthsMm.reduce((sum, width) => sum + width, 0);
  const weights = totalMm > 0 ? widthsMm : widthsMm.map(() => 1);
  const weightSum = weights.reduce((sum, weight) => sum + weight, 0);
  const quotas = weights.map((weight) => (count * weight) / weightSum);
  const shares = quotas.map(Math.floor);
  const byRemainder = quotas.map((quota, index) => ({ index, remainder: quota - Math.floor(quota) })).sort((a, b) => b.remainder - a.remainder || a.index - b.index);
  let left = count - shares.reduce((sum, share) => sum + share, 0);
  for (const { index } of byRemainder) {
    if (left-- <= 0) break;
    shares[index]! += 1;
  }
  return shares;
}

/** `count` points from one end of the stretch to the other; a single point at its middle. */
function spreadOver([left, right]: SpanAcrossMm, count: number): number[] {
  if (count === 1) return [(left + right) / 2];
  return Array.from({ length: count }, (_, index) => left + ((right - left) * index) / (count - 1));
}
