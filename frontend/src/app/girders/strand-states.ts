import { applyStrandDamage, damageEntryOfFinding, FINDING_KIND_NAMES, type DamageEntry, type FindingDetail, type StrandRow } from '@spanledger/shared';

/** How the cross-section draws one strand: intact, lost (crossed out), with section loss (hatched) or exposed (outlined). */
export const STRAND_DRAW_STATES = ['intact', 'lost', 'section-loss', 'exposed'] as const;
export type StrandDrawState = (typeof STRAND_DRAW_STATES)[number];

export const STRAND_DRAW_STATE_NAMES: Readonly<Record<StrandDrawState, string>> = {
  intact: 'Intact',
  lost: 'Lost',
  'section-loss': 'Section loss',
  exposed: 'Exposed',
};

/** Per strand row id, one state per strand by index (0…count−1); a strand not listed is intact. */
export type StrandStates = Readonly<Record<string, readonly StrandDrawState[]>>;

/** One strand of a row, by its index in the row (its `xMm` order when positions are given). */
export interface StrandRef {
  readonly rowId: string;
  readonly index: number;
}

/** The drawing's strand states from a girder's findings, and the findings that name strands the rows do not have. */
export interface FindingStrandStates {
  readonly states: StrandStates;
  /** One line per problem in applying a finding to the current rows: a row removed, a count beyond what is left. */
  readonly unplaced: readonly string[];
}

/**
 * The strand states a girder's open findings leave, as a rating applies them: each open finding's
 * damage entry (lost strands; section loss and broken wires as a loss of area; exposed strands)
 * through the engine's own strand selection, oldest finding first, so a count takes the
 * lowest-numbered strands still standing. A strand lost is drawn lost whatever else it has; one
 * with any loss of area is drawn with section loss before being drawn exposed.
 */
export function strandStatesOfOpenFindings(findings: readonly FindingDetail[], rows: readonly StrandRow[]): FindingStrandStates {
  // The register answers newest first; damage builds up from the oldest.
  const strandFindings = [...findings].reverse().flatMap((finding) => {
    if (finding.registerState !== 'open') return [];
    const entry = damageEntryOfFinding(finding);
    return entry && 'rowId' in entry ? [{ finding, entry }] : [];
  });
  const damage: DamageEntry[] = strandFindings.map(({ entry }) => entry);
  const result = applyStrandDamage(rows, damage);
  const states = Object.fromEntries(
    [...result.states].map(([rowId, strands]) => [rowId, strands.map((strand): StrandDrawState => (strand.lost ? 'lost' : strand.areaFactor < 1 ? 'section-loss' : strand.exposed ? 'exposed' : 'intact'))]),
  );
  const unplaced = result.issues.map((issue) => {
    const position = Number(/^damage\[(\d+)\]/.exec(issue.path)?.[1]);
    const finding = strandFindings[position]?.finding;
    return finding ? `${FINDING_KIND_NAMES[finding.kind]} (finding ${finding.id}): ${issue.message}` : issue.message;
  });
  return { states, unplaced };
}
