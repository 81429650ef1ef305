import { isDeepStrictEqual } from 'node:util';
import {
  damageEntryOfFinding,
  EngineInputError,
  parseRateFile,
  rateGirderLine,
  VEHICLE_LIBRARY,
  type AppliedFinding,
  type CalcFileIssue,
  type DamageEntry,
  type RateOutput,
  type RatingRun,
} from '../../../shared/src';
import { girderCalcFileParts, type StoredGirder } from '../girders/girder-calc-file';
import { AppError, type InvalidField } from '../http/app-error';
import type { FindingRow } from '../inspections/inspections.repository';
import { findingDamageOfRow } from '../inspections/inspections.service';
import type { LibraryDefinitionRow } from '../library/library.repository';
import type { SpanRow } from '../spans/spans.repository';
import type { StructureRow } from '../structures/structures.repository';

/** What a rating of a span is assembled from, read in one transaction. */
export interface RatingSources {
  readonly structure: StructureRow;
  readonly span: SpanRow;
  readonly girders: readonly (StoredGirder & { id: number })[];
  readonly openFindings: readonly FindingRow[];
  /** The superstructure condition of an inspection submitted and not yet accepted, if any. */
  readonly pendingCondition: { readonly superstructure: number; readonly inspectedOn: string } | null;
  readonly vehicles: readonly LibraryDefinitionRow[];
  readonly policies: readonly LibraryDefinitionRow[];
}

export interface AssembledGirder {
  readonly girderId: number;
  readonly girderNumber: number;
  readonly position: 'interior' | 'exterior';
  readonly calcFile: Record<string, unknown>;
  /** Where each damage entry of the file came from, by its position in `damage`. */
  readonly damageOrigins: readonly DamageOrigin[];
}

type DamageOrigin = { readonly findingId: number } | { readonly hypothetical: number };

export interface AssembledRating {
  readonly girders: readonly AssembledGirder[];
  readonly appliedFindings: readonly AppliedFinding[];
  readonly vehicles: readonly { id: string; version: string; name: string; category: string | null }[];
  readonly policy: { readonly id: string; readonly version: string };
  /** What the rater should know of the assembly itself, e.g. where the condition rating came from. */
  readonly notes: readonly string[];
}

const notRatable = (message: string) => new AppError({ code: 'not_ratable', status: 409, message });

/** The girders the run names (all of the span's when it names none), refusing one from elsewhere. */
function girdersToRate(sources: RatingSources, run: RatingRun) {
  if (!run.girderIds) return sources.girders;
  const problems: InvalidField[] = run.girderIds.flatMap((id, index) =>
    sources.girders.some((girder) => girder.id === id) ? [] : [{ field: `girderIds.${index}`, message: `girder ${id} is not in span ${sources.span.span_index}` }],
  );
  if (problems.length > 0) throw AppError.invalidFields(problems);
  return sources.girders.filter((girder) => run.girderIds!.includes(girder.id));
}

/**
 * A library vehicle is named by id when its stored version is the engine's own, so the file reads
 * as the command line would; a version an administrator added travels inline under
 * `<id>@<version>`, since an inline vehicle may not reuse a library id.
 */
function vehicleReference(row: LibraryDefinitionRow): string | Record<string, unknown> {
  const builtIn = VEHICLE_LIBRARY.get(row.id);
  if (builtIn && isDeepStrictEqual(row.definition, JSON.parse(JSON.stringify(builtIn)))) return row.id;
  return builtIn ? { ...row.definition, id: `${row.id}@${row.version}` } : row.definition;
}

/** A library vehicle as a record lists it: id, version, name and category. */
export function vehicleSummary(row: LibraryDefinitionRow): AssembledRating['vehicles'][number] {
  return { id: row.id, version: row.version, name: row.definition.name ?? row.id, category: row.definition.category ?? null };
}

function chosenVehicles(sources: RatingSources, run: RatingRun): LibraryDefinitionRow[] {
  const problems: InvalidField[] = [];
  const chosen = run.vehicleIds.flatMap((id, index) => {
    const row = sources.vehicles.find((vehicle) => vehicle.id === id);
    if (!row) problems.push({ field: `vehicleIds.${index}`, message: `the vehicle library has no vehicle "${id}"` });
    else if (run.vehicleIds.indexOf(id) !== index) problems.push({ field: `vehicleIds.${index}`, message: `"${id}" is named twice` });
    return row ? [row] : [];
  });
  if (problems.length > 0) throw AppError.invalidFields(problems);
  return chosen;
}

function chosenPolicy(sources: RatingSources, run: RatingRun): LibraryDefinitionRow {
  const policy = sources.policies.find((candidate) => candidate.id === run.policyId);
  if (!policy) throw AppError.invalidFields([{ field: 'policyId', message: `there is no rating policy "${run.policyId}"` }]);
  return policy;
}

/** Every exclusion names an open finding of the span, once. */
function checkExclusions(sources: RatingSources, run: RatingRun): void {
  const problems: InvalidField[] = run.exclusions.flatMap(({ findingId }, index) => {
    if (!sources.openFindings.some((finding) => finding.id === findingId)) return [{ field: `exclusions.${index}.findingId`, message: `finding ${findingId} is not an open finding of this span` }];
    if (run.exclusions.findIndex((other) => other.findingId === findingId) !== index) return [{ field: `exclusions.${index}.findingId`, message: `finding ${findingId} is excluded twice` }];
    return [];
  });
  if (problems.length > 0) throw AppError.invalidFields(problems);
}

function checkHypotheticalGirders(rated: readonly { id: number }[], run: RatingRun): void {
  const problems: InvalidField[] = run.hypothetical.flatMap(({ girderId }, index) =>
    rated.some((girder) => girder.id === girderId) ? [] : [{ field: `hypothetical.${index}.girderId`, message: `girder ${girderId} is not among the girders rated` }],
  );
  if (problems.length > 0) throw AppError.invalidFields(problems);
}

/** The register's findings oldest first, as damage builds up: a count of strands takes the lowest-numbered still standing (as the girder drawing shows). */
function oldestFirst(findings: readonly FindingRow[]): FindingRow[] {
  return [...findings].sort((a, b) => a.inspected_on.localeCompare(b.inspected_on) || a.id - b.id);
}

/** The span's open findings on the given girders, oldest first, each with its damage entry and the reason it is excluded, if it is. */
export function findingsAsApplied(openFindings: readonly FindingRow[], girderIds: readonly number[], exclusions: RatingRun['exclusions']): AppliedFinding[] {
  const excludedReason = (id: number) => exclusions.find((exclusion) => exclusion.findingId === id)?.reason ?? null;
  return oldestFirst(openFindings)
    .filter((finding) => girderIds.includes(finding.girder_id))
    .map((finding) => ({
      findingId: finding.id,
      girderId: finding.girder_id,
      girderNumber: finding.girder_number,
      kind: finding.kind,
      fromM: finding.from_m,
      toM: finding.to_m,
      inspectedOn: finding.inspected_on,
      damageEntry: damageEntryOfFinding(findingDamageOfRow(finding)),
      excludedReason: excludedReason(finding.id),
    }));
}

/**
 * The rating's calculation files, one per girder (calc-file.md, `rate`): the girder and span as
 * stored, each open finding of the girder not excluded as a damage entry at its place (oldest
 * first), the what-if entries marked `hypothetical`, the superstructure condition (of an
 * inspection waiting for review when there is one, since its findings are applied) and the ADTT,
 * the vehicles and the policy inline with the version stored, so the file alone re-runs.
 */
export function assembleRating(sources: RatingSources, run: RatingRun): AssembledRating {
  const { structure, span, pendingCondition } = sources;
  // The findings of a submitted inspection are applied already; its condition rating goes with them.
  const superstructureCondition = pendingCondition?.superstructure ?? structure.superstructure_condition;
  if (superstructureCondition === null) throw notRatable(`Structure ${structure.structure_number} has no superstructure condition rating: submit an inspection that records one, then rate`);
  if (structure.adtt === null) throw notRatable(`Structure ${structure.structure_number} has no ADTT: the legal-load factor depends on it; enter it on the structure, then rate`);
  const rated = girdersToRate(sources, run);
  const vehicles = chosenVehicles(sources, run);
  const policy = chosenPolicy(sources, run);
  checkExclusions(sources, run);
  checkHypotheticalGirders(rated, run);

  const appliedFindings = findingsAsApplied(sources.openFindings, rated.map((girder) => girder.id), run.exclusions);

  const girders = rated.map((stored): AssembledGirder => {
    const damageOrigins: DamageOrigin[] = [];
    const damage: DamageEntry[] = [];
    for (const applied of appliedFindings) {
      if (applied.girderId !== stored.id || applied.excludedReason !== null || applied.damageEntry === null) continue;
      damage.push(applied.damageEntry);
      damageOrigins.push({ findingId: applied.findingId });
    }
    run.hypothetical.forEach((whatIf, index) => {
      if (whatIf.girderId !== stored.id) return;
      damage.push({ ...whatIf.entry, hypothetical: true });
      damageOrigins.push({ hypothetical: index });
    });
    const calcFile = {
      units: 'si',
      ...girderCalcFileParts(stored, span, structure.skew_deg),
      damage,
      options: { method: 'strain-compatibility', strandCurve: run.strandCurve, concreteModel: run.concreteModel },
      condition: { superstructure: superstructureCondition },
      traffic: { adtt: structure.adtt },
      vehicles: vehicles.map(vehicleReference),
      policy: policy.definition,
    };
    return { girderId: stored.id, girderNumber: stored.girder.girder_number, position: stored.girder.position, calcFile, damageOrigins };
  });

  return {
    girders,
    appliedFindings,
    vehicles: vehicles.map(vehicleSummary),
    policy: { id: policy.id, version: policy.version },
    notes: pendingCondition
      ? [`superstructure condition ${pendingCondition.superstructure} from the inspection of ${pendingCondition.inspectedOn}, submitted and not yet accepted (the structure's accepted rating is ${structure.superstructure_condition ?? 'none'})`]
      : [],
  };
}

/** A problem the engine finds in one girder's file, named where the rater can act on it: the finding, the what-if entry, or the girder's record. */
function fieldOfIssue(girder: AssembledGirder, issue: CalcFileIssue): InvalidField {
  const damage = /^damage\[(\d+)\](.*)$/.exec(issue.path);
  const origin = damage ? girder.damageOrigins[Number(damage[1])] : undefined;
  if (origin && 'findingId' in origin) {
    return { field: `findings.${origin.findingId}`, message: `girder ${girder.girderNumber}, finding ${origin.findingId}: ${issue.message}; have the finding corrected, or exclude it with a reason` };
  }
  if (origin && 'hypothetical' in origin) {
    const rest = damage![2]!.replace(/^\./, '').replace(/\[(\d+)\]/g, '.$1');
    return { field: `hypothetical.${origin.hypothetical}.entry${rest ? `.${rest}` : ''}`, message: issue.message };
  }
  return { field: `girders.${girder.girderNumber}.${issue.path}`, message: `girder ${girder.girderNumber}: ${issue.message}` };
}

/** Rates each girder's file with the engine, or refuses the whole run naming every problem. */
export function rateAssembled(girders: readonly AssembledGirder[]): RateOutput[] {
  const parsed = girders.map((girder) => ({ girder, result: parseRateFile(girder.calcFile) }));
  const problems = parsed.flatMap(({ girder, result }) => (result.ok ? [] : result.issues.map((issue) => fieldOfIssue(girder, issue))));
  if (problems.length > 0) throw AppError.invalidFields(problems);
  return parsed.map(({ girder, result }) => {
    if (!result.ok) throw new Error('unreachable: refused above');
    try {
      return rateGirderLine(result.file);
    } catch (error) {
      if (error instanceof EngineInputError) throw AppError.invalidFields([fieldOfIssue(girder, { path: error.path, message: error.problem })]);
      throw error;
    }
  });
}
