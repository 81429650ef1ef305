import type { StrandRow } from '../calc-file/girder';
import type { Debonding, Profile, RateFile } from '../calc-file/rate-file';
import { applyStrandDamage, type StrandState } from '../calc-file/strand-damage';
import type { StrandDevelopment } from '../capacity/build-section-model';
import { developmentKappa, developmentLengthMm, transferLengthMm } from '../capacity/development';

/**
 * What happens to each strand along the span (engineering.md §5): where it is broken, corroded
 * or exposed, where it is debonded, and so how far each station is from the points where its
 * bond begins. Distances in mm from the start support.
 */

interface Zone {
  readonly fromMm: number;
  readonly toMm: number;
}

/** One strand's story along the span. */
interface StrandPlan {
  readonly brokenZones: readonly Zone[];
  readonly exposedZones: readonly Zone[];
  readonly sectionLosses: readonly (Zone & { readonly fraction: number })[];
  /** Zones without bond: debonded lengths at the ends. */
  readonly debondedZones: readonly Zone[];
  readonly kappa: number;
}

export interface SpanStrands {
  readonly spanLengthMm: number;
  readonly rows: readonly StrandRow[];
  readonly plans: readonly (readonly StrandPlan[])[];
  readonly profiles: ReadonlyMap<string, Profile>;
  /** Pretensioned strands bond from the member ends; post-tensioned tendons are anchored there. */
  readonly bondsFromEnds: boolean;
  /** Beyond this distance from every bond start and exposed zone a strand of the row is fully developed. */
  readonly fullDevelopmentMm: readonly number[];
}

const zoneOf = (entry: { fromM?: number | undefined; toM?: number | undefined }): Zone => ({ fromMm: entry.fromM! * 1000, toMm: entry.toM! * 1000 });
const inside = (zone: Zone, xMm: number) => zone.fromMm <= xMm && xMm <= zone.toMm;

function debondedZones(debonding: readonly Debonding[], rowId: string, strand: number, spanLengthMm: number): Zone[] {
  const lengthMm = Math.max(0, ...debonding.filter((entry) => entry.rowId === rowId && entry.strands.includes(strand)).map((entry) => entry.lengthM * 1000));
  return lengthMm > 0 ? [{ fromMm: 0, toMm: lengthMm }, { fromMm: spanLengthMm - lengthMm, toMm: spanLengthMm }] : [];
}

/**
 * Every strand's plan, from the damage entries (each applied to the strands the file's order
 * gives it, as `applyStrandDamage` assigns them), the debonding and the member depth.
 */
export function planSpanStrands(file: RateFile, memberDepthMm: number): SpanStrands {
  const spanLengthMm = file.span.lengthM * 1000;
  const rows = file.girder.strandRows;
  const { strandsByEntry } = applyStrandDamage(rows, file.damage);
  const plans = rows.map((row) =>
    Array.from({ length: row.count }, (_, strand): StrandPlan => {
      const entries = file.damage.filter((entry, i) => 'rowId' in entry && entry.rowId === row.id && strandsByEntry[i]!.includes(strand));
      const debonded = debondedZones(file.debonding, row.id, strand, spanLengthMm);
      return {
        brokenZones: entries.filter((entry) => entry.kind === 'lost-strands').map(zoneOf),
        exposedZones: entries.filter((entry) => entry.kind === 'exposed-strands').map(zoneOf),
        sectionLosses: entries.flatMap((entry) => (entry.kind === 'strand-area-loss' ? [{ ...zoneOf(entry), fraction: entry.lossFraction }] : [])),
        debondedZones: debonded,
        kappa: developmentKappa(memberDepthMm, debonded.length > 0),
      };
    }),
  );
  const fullDevelopmentMm = rows.map((row) => developmentLengthMm(2.0, row.fpuMpa, 0, row.strandDiameterMm));
  return {
    spanLengthMm,
    rows,
    plans,
    profiles: new Map(file.profiles.map((profile) => [profile.rowId, profile])),
    bondsFromEnds: file.girder.tensioning === 'pre',
    fullDevelopmentMm,
  };
}

/** A row's height at a station (engineering.md §5, Profiles). */
export function rowHeightAtMm(row: StrandRow, profile: Profile | undefined, xMm: number, spanLengthMm: number): number {
  if (!profile || profile.shape === 'straight') return row.yMm;
  if (profile.shape === 'draped') {
    const shape = (4 * xMm * (spanLengthMm - xMm)) / (spanLengthMm * spanLengthMm);
    return profile.endYMm + (row.yMm - profile.endYMm) * shape;
  }
  const [firstMm, secondMm] = profile.holdDownM.map((x) => x * 1000) as [number, number];
  if (xMm < firstMm) return profile.endYMm + ((row.yMm - profile.endYMm) * xMm) / firstMm;
  if (xMm > secondMm) return profile.endYMm + ((row.yMm - profile.endYMm) * (spanLengthMm - xMm)) / (spanLengthMm - secondMm);
  return row.yMm;
}

/** The rows as they lie at a station: each at its profile's height there. */
export function rowsAtMm(strands: SpanStrands, xMm: number): StrandRow[] {
  return strands.rows.map((row) => ({ ...row, yMm: rowHeightAtMm(row, strands.profiles.get(row.id), xMm, strands.spanLengthMm) }));
}

/** Distance from x to where the strand's bond begins on either side, within the sound length x lies in. */
function bondDistanceMm(plan: StrandPlan, strands: SpanStrands, xMm: number): number {
  let left = strands.bondsFromEnds ? 0 : Number.NEGATIVE_INFINITY;
  let right = strands.bondsFromEnds ? strands.spanLengthMm : Number.POSITIVE_INFINITY;
  for (const zone of [...plan.brokenZones, ...plan.debondedZones]) {
    if (zone.toMm <= xMm) left = Math.max(left, zone.toMm);
    if (zone.fromMm >= xMm) right = Math.min(right, zone.fromMm);
  }
  return Math.min(xMm - left, right - xMm);
}

function exposedDistanceMm(plan: StrandPlan, xMm: number): number {
  let distance = Number.POSITIVE_INFINITY;
  for (const zone of plan.exposedZones) distance = Math.min(distance, inside(zone, xMm) ? 0 : Math.min(Math.abs(xMm - zone.fromMm), Math.abs(xMm - zone.toMm)));
  return distance;
}

/**
 * Each strand at a station: lost where it is broken or debonded, its area less the section loss
 * acting there, exposed inside an exposed zone; and how far it is from where its bond begins,
 * for the strength it can develop.
 */
export function strandsAtMm(strands: SpanStrands, xMm: number): { states: Map<string, StrandState[]>; development: StrandDevelopment } {
  const states = new Map(
    strands.rows.map((row, rowIndex) => [
      row.id,
      strands.plans[rowIndex]!.map((plan) => {
        const lost = [...plan.brokenZones, ...plan.debondedZones].some((zone) => inside(zone, xMm));
        const loss = plan.sectionLosses.reduce((sum, zone) => (inside(zone, xMm) ? sum + zone.fraction : sum), 0);
        return { lost, areaFactor: Math.max(1 - loss, 0), exposed: plan.exposedZones.some((zone) => inside(zone, xMm)) };
      }),
    ]),
  );
  const development: StrandDevelopment = (rowIndex, strandIndex) => {
    const plan = strands.plans[rowIndex]![strandIndex]!;
    const bond = bondDistanceMm(plan, strands, xMm);
    const exposed = exposedDistanceMm(plan, xMm);
    const full = strands.fullDevelopmentMm[rowIndex]!;
    if (bond >= full && exposed >= full) return null;
    return { bondDistanceMm: bond >= full ? Number.POSITIVE_INFINITY : bond, exposedDistanceMm: exposed >= full ? Number.POSITIVE_INFINITY : exposed, kappa: plan.kappa };
  };
  return { states, development };
}

/**
 * Points where capacity changes slope (engineering.md §5, Stations): harp points, ends of
 * debonding, edges of damage, and lt and ld beyond every point where bond begins (ld with the
 * row's fps at midspan, `fpsByRow`).
 */
export function developmentStationsMm(strands: SpanStrands, fpsByRow: readonly number[]): number[] {
  const points: number[] = [];
  for (const profile of strands.profiles.values()) if (profile.shape === 'harped') points.push(...profile.holdDownM.map((x) => x * 1000));
  strands.rows.forEach((row, rowIndex) => {
    const lt = transferLengthMm(row.strandDiameterMm);
    const fpe = row.fpeMpa ?? 0;
    for (const plan of strands.plans[rowIndex]!) {
      const ld = developmentLengthMm(plan.kappa, fpsByRow[rowIndex] ?? row.fpuMpa, fpe, row.strandDiameterMm);
      const bondStarts = [
        ...(strands.bondsFromEnds ? [{ at: 0, side: 1 }, { at: strands.spanLengthMm, side: -1 }] : []),
        ...[...plan.brokenZones, ...plan.debondedZones].flatMap((zone) => [{ at: zone.fromMm, side: -1 }, { at: zone.toMm, side: 1 }]),
      ];
      for (const { at, side } of bondStarts) points.push(at, at + side * lt, at + side * ld);
      for (const zone of plan.exposedZones) points.push(zone.fromMm, zone.toMm, zone.fromMm - (ld - lt), zone.toMm + (ld - lt));
    }
  });
  return points;
}
