import type { CalcFileIssue } from './json-path';
import type { DamageEntry, StrandDamageEntry, StrandRow } from './girder';

/** What damage leaves of one strand at the section. */
export interface StrandState {
  lost: boolean;
  /** Remaining fraction of the strand's area after section loss. */
  areaFactor: number;
  /** Bond lost over a length (exposed strand): carries at most fpe at the section. */
  exposed: boolean;
}

export interface StrandDamageResult {
  /** Per row id, one state per strand in the order of the row's `xMm` (or 0…count−1). */
  readonly states: ReadonlyMap<string, readonly StrandState[]>;
  readonly issues: readonly CalcFileIssue[];
  /** The strands each damage entry takes, by its position in the list (empty for entries on concrete). */
  readonly strandsByEntry: readonly (readonly number[])[];
}

const isStrandEntry = (entry: DamageEntry): entry is StrandDamageEntry => 'rowId' in entry;

/**
 * The strands an entry names, by index into the row (its `xMm` order when positions are given,
 * else 0…count−1); counted entries take the lowest-numbered strands still standing.
 */
function selectStrands(entry: StrandDamageEntry, row: StrandRow, states: StrandState[], path: string, issues: CalcFileIssue[]): number[] {
  if ((entry.count === undefined) === (entry.strands === undefined)) {
    issues.push({ path, message: 'give either "count" or "strands", not both or neither' });
    return [];
  }
  if (entry.strands !== undefined) return namedStrands(entry.strands, row, states, `${path}.strands`, issues);
  const standing = states.flatMap((state, index) => (state.lost || alreadyAffected(entry, state) ? [] : [index]));
  const count = entry.count ?? 0;
  if (count > standing.length) {
    issues.push({ path: `${path}.count`, message: `${count} strands named but row "${row.id}" has only ${standing.length} left that this damage can reach` });
    return [];
  }
  return standing.slice(0, count);
}

function alreadyAffected(entry: StrandDamageEntry, state: StrandState): boolean {
  return entry.kind === 'exposed-strands' ? state.exposed : false;
}

function namedStrands(indexes: readonly number[], row: StrandRow, states: StrandState[], path: string, issues: CalcFileIssue[]): number[] {
  const valid: number[] = [];
  indexes.forEach((index, position) => {
    if (index >= row.count) issues.push({ path: `${path}[${position}]`, message: `row "${row.id}" has strands 0–${row.count - 1} only` });
    else if (indexes.indexOf(index) !== position) issues.push({ path: `${path}[${position}]`, message: `strand ${index} is named twice` });
    else if (states[index]!.lost) issues.push({ path: `${path}[${position}]`, message: `strand ${index} of row "${row.id}" is already lost` });
    else valid.push(index);
  });
  return valid;
}

function applyEntry(entry: StrandDamageEntry, strands: number[], states: StrandState[], path: string, issues: CalcFileIssue[]): void {
  for (const index of strands) {
    const state = states[index]!;
    if (entry.kind === 'lost-strands') state.lost = true;
    else if (entry.kind === 'exposed-strands') state.exposed = true;
    else {
      // Section losses of one strand add up: 15 % then 10 % leaves 75 % of the area.
      const remaining = state.areaFactor - entry.lossFraction;
      if (remaining < -1e-12) issues.push({ path: `${path}.lossFraction`, message: `strand ${index} would lose more than its whole area` });
      state.areaFactor = Math.max(remaining, 0);
    }
  }
}

/**
 * Applies the strand entries of a damage list in file order: lost strands, section loss and
 * exposed strands, each naming its row by id. Damage that asks for more than exists is an
 * issue at the entry's path; the rest still applies, so every problem is reported at once.
 */
export function applyStrandDamage(rows: readonly StrandRow[], damage: readonly DamageEntry[], damagePath = 'damage'): StrandDamageResult {
  const states = new Map(rows.map((row) => [row.id, Array.from({ length: row.count }, () => ({ lost: false, areaFactor: 1, exposed: false }))]));
  const issues: CalcFileIssue[] = [];
  const strandsByEntry = damage.map((entry, position): number[] => {
    if (!isStrandEntry(entry)) return [];
    const path = `${damagePath}[${position}]`;
    const row = rows.find((candidate) => candidate.id === entry.rowId);
    const rowStates = states.get(entry.rowId);
    if (!row || !rowStates) {
      issues.push({ path: `${path}.rowId`, message: `no strand row has id "${entry.rowId}"` });
      return [];
    }
    const strands = selectStrands(entry, row, rowStates, path, issues);
    applyEntry(entry, strands, rowStates, path, issues);
    return strands;
  });
  return { states, issues, strandsByEntry };
}
