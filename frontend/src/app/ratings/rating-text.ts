import type { ComparedRatingOfRecord, ControllingRating, HypotheticalDamage, RatingFigures } from '@spanledger/shared';

/** Rating factors are read to two decimals, as they are compared with 1.0. */
export function ratingFactorText(ratingFactor: number | null): string {
  return ratingFactor === null ? 'Not rated' : ratingFactor.toFixed(2);
}

/** "+0.12" / "−0.30" / "no change": a record against the rating of record. */
export function ratingChangeText(now: number | null, before: number | null): string {
  if (now === null || before === null) return '—';
  const change = Number((now - before).toFixed(2));
  if (change === 0) return 'no change';
  return `${change > 0 ? '+' : '−'}${Math.abs(change).toFixed(2)}`;
}

const LEVEL_NAMES: Readonly<Record<ControllingRating['level'], string>> = {
  inventory: 'Design inventory',
  operating: 'Design operating',
  legal: 'Legal load',
  permit: 'Permit load',
};
const LIMIT_STATE_NAMES: Readonly<Record<ControllingRating['limitState'], string>> = { 'strength-i': 'Strength I', 'service-iii': 'Service III' };

/** "Legal load · Strength I". */
export function ratingCaseText(rating: Pick<ControllingRating, 'level' | 'limitState'>): string {
  return `${LEVEL_NAMES[rating.level]} · ${LIMIT_STATE_NAMES[rating.limitState]}`;
}

/** A day and time of the record's steps, in the user's own zone. */
const MOMENT_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });
export function momentText(isoDateTime: string): string {
  return MOMENT_FORMAT.format(new Date(isoDateTime));
}

/** Whether the figures put a legal load below 1.0: the structure needs a posting decision. */
export const belowLegal = (figures: RatingFigures) => figures.lowestLegalRf !== null && figures.lowestLegalRf < 1;

/**
 * A what-if damage entry in words, e.g. "Girder 2: 3 lost strands in row r1 from 5.00 m to 6.00 m
 * — if the strike had cut three strands"; lengths through the caller's unit formatting.
 */
export function whatIfText(whatIf: HypotheticalDamage, girderNumber: number | undefined, length: (metres: number) => string): string {
  const { entry } = whatIf;
  const what = 'count' in entry && entry.count !== undefined ? `${entry.count} lost strand${entry.count === 1 ? '' : 's'} in row ${'rowId' in entry ? entry.rowId : ''}` : entry.kind;
  const place = entry.fromM !== undefined && entry.toM !== undefined ? ` from ${length(entry.fromM)} to ${length(entry.toM)}` : '';
  return `Girder ${girderNumber ?? whatIf.girderId}: ${what}${place}${whatIf.note ? ` — ${whatIf.note}` : ''}`;
}

/** A rating on file from before Spanledger was approved on a day, not at a moment: read in UTC so no time zone moves it. */
const PRIOR_DAY = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeZone: 'UTC' });

/** A day ('YYYY-MM-DD') as people read it, "Jun 7, 2018", the same day wherever the reader is. */
export const dayText = (isoDate: string): string => PRIOR_DAY.format(new Date(`${isoDate}T00:00:00Z`));

/** What a rating is compared with: Spanledger's rating of record, a rating on file from before Spanledger, or none. */
export function previousRecordText(before: ComparedRatingOfRecord | null): string {
  if (!before) return 'First rating of this span: no rating of record to compare with';
  if (before.priorRating) {
    return `Change from the rating on file from before Spanledger (approved ${dayText(before.priorRating.approvedOn)}; ${before.priorRating.sourceNote})`;
  }
  return `Change from the rating of record (rating ${before.id}, approved ${new Date(before.approvedAt).toLocaleDateString('en', { dateStyle: 'medium' })})`;
}
