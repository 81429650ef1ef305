import type { FindingDetail, FindingDisposition } from '@spanledger/shared';

/** Inspection dates are calendar days: read them in UTC so no time zone moves them. */
const DAY_FORMAT = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeZone: 'UTC' });

/** "May 14, 2024" for "2024-05-14". */
export function inspectionDay(isoDate: string): string {
  return DAY_FORMAT.format(new Date(isoDate));
}

/** Today in the user's own calendar, as the API writes a date ("YYYY-MM-DD"). */
export function localToday(now: Date = new Date()): string {
  const twoDigits = (value: number) => String(value).padStart(2, '0');
  return `${now.getFullYear()}-${twoDigits(now.getMonth() + 1)}-${twoDigits(now.getDate())}`;
}

/** What this inspection says of each finding, in words. */
export const DISPOSITION_NAMES: Readonly<Record<FindingDisposition, string>> = {
  new: 'New',
  'to-review': 'Carried forward, to review',
  confirmed: 'Confirmed as before',
  grown: 'Grown',
  repaired: 'Repaired',
};

/** The strands a finding names, numbered as the API and the cross-section drawing number them (0…count−1 across the row). */
export function strandsText(strands: FindingDetail['strands']): string {
  if (strands === null) return '';
  if (strands.strands !== undefined) {
    const numbers = [...strands.strands].sort((a, b) => a - b);
    return `Row ${strands.rowId}: strand${numbers.length === 1 ? '' : 's'} ${numbers.join(', ')}`;
  }
  const count = strands.count ?? 0;
  return `Row ${strands.rowId}: ${count} strand${count === 1 ? '' : 's'}`;
}

const FINDING_FIELD_LABELS: Readonly<Record<string, string>> = {
  girderId: 'Girder',
  kind: 'Kind',
  strands: 'Strands',
  'strands.rowId': 'Strand row',
  'strands.count': 'Number of strands',
  'strands.strands': 'Strands tapped',
  lossFraction: 'Fraction of area lost',
  brokenWires: 'Broken wires per strand',
  spall: 'Spall',
  'spall.depthMm': 'Spall depth',
  'spall.widthMm': 'Spall width',
  deckLossMm: 'Deck thickness lost',
  crackWidthMm: 'Crack width',
  fromM: 'From',
  toM: 'To',
  severity: 'Severity',
  notes: 'Notes',
  disposition: 'Disposition',
  version: 'Version',
  inspectedOn: 'Date inspected',
  deckCondition: 'Deck condition',
  superstructureCondition: 'Superstructure condition',
  substructureCondition: 'Substructure condition',
  comment: 'Comment',
};

/** The label people read for a field of an inspection or finding body, as the server names it. */
export function inspectionFieldLabel(field: string): string {
  return FINDING_FIELD_LABELS[field] ?? field;
}
