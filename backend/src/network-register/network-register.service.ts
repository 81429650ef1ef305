import { RESULT_CAUTION } from '../../../shared/src';
import type { Database } from '../db/database';
import { findAllStructures, type StructureRow } from '../structures/structures.repository';

interface Column {
  readonly heading: string;
  readonly value: (row: StructureRow) => string | number | null;
}

const COLUMNS: readonly Column[] = [
  { heading: 'Structure number', value: (row) => row.structure_number },
  { heading: 'Name', value: (row) => row.name },
  { heading: 'Route carried', value: (row) => row.route_carried },
  { heading: 'Feature crossed', value: (row) => row.feature_crossed },
  { heading: 'District', value: (row) => row.district },
  { heading: 'Latitude', value: (row) => row.latitude },
  { heading: 'Longitude', value: (row) => row.longitude },
  { heading: 'Year built', value: (row) => row.year_built },
  { heading: 'ADT (vehicles/day)', value: (row) => row.adt },
  { heading: 'ADTT (trucks/day)', value: (row) => row.adtt },
  { heading: 'Year of last major work', value: (row) => row.year_last_major_work },
  { heading: 'Skew (degrees)', value: (row) => row.skew_deg },
  { heading: 'Status', value: (row) => row.status },
  { heading: 'Deck condition', value: (row) => row.deck_condition },
  { heading: 'Superstructure condition', value: (row) => row.superstructure_condition },
  { heading: 'Substructure condition', value: (row) => row.substructure_condition },
  { heading: 'Condition rated on', value: (row) => row.condition_rated_on },
];

/**
 * One CSV field (RFC 4180): quoted when it holds a comma, quote or line break. Text that a
 * spreadsheet would run as a formula (= + - @ at the start) gets a leading apostrophe.
 */
function csvField(value: string | number | null): string {
  if (value === null) return '';
  if (typeof value === 'number') return String(value);
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

const csvLine = (fields: ReadonlyArray<string | number | null>) => fields.map(csvField).join(',');

/** The network register as CSV: every structure, then the caution every export carries. */
export async function networkRegisterCsv({ db }: { db: Database }): Promise<string> {
  const rows = await findAllStructures(db);
  const lines = [csvLine(COLUMNS.map((column) => column.heading)), ...rows.map((row) => csvLine(COLUMNS.map((column) => column.value(row)))), '', csvLine([`Caution: ${RESULT_CAUTION}`])];
  return `${lines.join('\r\n')}\r\n`;
}
