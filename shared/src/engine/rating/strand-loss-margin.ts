import type { DamageEntry } from '../calc-file/girder';
import { applyStrandDamage } from '../calc-file/strand-damage';
import type { RateFile } from '../calc-file/rate-file';
import { developmentLengthMm } from '../capacity/development';
import { controllingRatings, rateGirderLine, type ControllingRating, type RatingStation } from './rate';
import { rowHeightAtMm, strandsAtMm, type SpanStrands } from './strands-along-span';

/** How many more strands could break before a legal-load rating falls below 1.0 (engineering.md §7). */
export interface StrandLossMargin {
  /** Further strands whose loss takes the controlling legal RF below 1.0; 0 when it is already below. */
  readonly count: number | null;
  readonly strands: readonly { readonly rowId: string; readonly index: number }[];
  /** The station with the least legal reserve, where the strands are taken. */
  readonly atXM: number | null;
  readonly note?: string;
}

const lowestLegal = (controlling: readonly ControllingRating[]) =>
  controlling.filter((rating) => rating.level === 'legal').reduce<ControllingRating | null>((low, rating) => (!low || rating.ratingFactor < low.ratingFactor ? rating : low), null);

/** Strands still carrying load at a station, the deepest (largest dp, lowest) first. */
function candidateStrands(strands: SpanStrands, xMm: number): { rowId: string; index: number }[] {
  const { states } = strandsAtMm(strands, xMm);
  return strands.rows
    .flatMap((row) => {
      const heightMm = rowHeightAtMm(row, strands.profiles.get(row.id), xMm, strands.spanLengthMm);
      return states.get(row.id)!.flatMap((state, index) => (state.lost ? [] : [{ rowId: row.id, index, heightMm }]));
    })
    .sort((a, b) => a.heightMm - b.heightMm)
    .map(({ rowId, index }) => ({ rowId, index }));
}

/**
 * The strand-loss margin (engineering.md §7): at the station with the least legal-load reserve,
 * break one more strand at a time, the deepest first, and re-rate, until the controlling legal
 * RF (strength, and Service III where the policy rates it) falls below 1.0. A linear scan, never
 * a bisection, because φ can make RF rise as strands are lost. A break changes the girder only
 * within a development length of it, so each step re-rates the stations there (with the new
 * break's own development points) and keeps the rest of the girder line's ratings.
 */
export function strandLossMargin(
  file: RateFile,
  stations: readonly RatingStation[],
  controlling: readonly ControllingRating[],
  strands: SpanStrands,
  fpsByRow: readonly number[],
): StrandLossMargin {
  const lowest = lowestLegal(controlling);
  if (!lowest) return { count: null, strands: [], atXM: null, note: 'no legal load is rated, so there is no margin to legal loads' };
  if (lowest.ratingFactor < 1) return { count: 0, strands: [], atXM: lowest.xM, note: 'already below 1.0' };

  const atMm = lowest.xM * 1000;
  const reachMm = Math.max(...strands.rows.map((row, i) => developmentLengthMm(2.0, fpsByRow[i] ?? row.fpuMpa, 0, row.strandDiameterMm)));
  const near = { fromMm: atMm - reachMm, toMm: atMm + reachMm };
  const elsewhere = lowestLegal(controllingRatings(stations.filter((station) => station.xM * 1000 < near.fromMm || station.xM * 1000 > near.toMm)));
  const taken: { rowId: string; index: number }[] = [];
  const breaks: DamageEntry[] = [];
  for (const strand of candidateStrands(strands, atMm)) {
    const trial: DamageEntry = { kind: 'lost-strands', rowId: strand.rowId, strands: [strand.index], fromM: lowest.xM, toM: lowest.xM, hypothetical: true };
    const damage = [...file.damage, ...breaks, trial];
    // Damage is assigned to strands once for the whole span, so a strand already broken
    // elsewhere cannot take a second break here: leave it out rather than count a break that did not happen.
    if (applyStrandDamage(file.girder.strandRows, damage).strandsByEntry[damage.length - 1]!.length === 0) continue;
    taken.push(strand);
    breaks.push(trial);
    const local = rateGirderLine({ ...file, damage }, { onlyNearMm: near });
    const low = lowestLegal(local.summary.controlling);
    if (Math.min(low?.ratingFactor ?? Infinity, elsewhere?.ratingFactor ?? Infinity) < 1) return { count: taken.length, strands: taken, atXM: lowest.xM };
  }
  return { count: null, strands: taken, atXM: lowest.xM, note: 'the legal-load ratings stay at or above 1.0 with every strand broken at this station' };
}
