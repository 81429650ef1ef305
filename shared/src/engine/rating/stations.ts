import type { DamageEntry } from '../calc-file/girder';
import type { Span } from '../calc-file/rate-file';

/** Stations closer than this are one (1 mm: below any measurement along a span). */
const SAME_STATION_MM = 1;

/**
 * Where the girder line is rated (engineering.md §5, the part that applies to straight strands):
 * the twentieth points (the tenth points and halfway between, for a smooth capacity–demand
 * chart), every diaphragm and both edges of every damage entry, between the supports (at a
 * support a simple span carries no moment), and the points along the span where the strands'
 * development changes (`developmentStationsMm`).
 */
export function ratingStationsMm(span: Span, damage: readonly DamageEntry[], alongSpanPointsMm: readonly number[] = []): number[] {
  const lengthMm = span.lengthM * 1000;
  const candidates = [
    ...Array.from({ length: 19 }, (_, i) => ((i + 1) * lengthMm) / 20),
    ...span.diaphragms.map((diaphragm) => diaphragm.xM * 1000),
    ...damage.flatMap((entry) => [entry.fromM, entry.toM].filter((x): x is number => x !== undefined).map((x) => x * 1000)),
    ...alongSpanPointsMm,
  ];
  const inside = candidates.filter((x) => x > SAME_STATION_MM && x < lengthMm - SAME_STATION_MM).sort((a, b) => a - b);
  return inside.filter((x, i) => i === 0 || x - inside[i - 1]! > SAME_STATION_MM);
}

/** The damage entries that act at a station: those whose fromM–toM length covers it. */
export function damageAt(damage: readonly DamageEntry[], xMm: number): DamageEntry[] {
  return damage.filter((entry) => entry.fromM! * 1000 - SAME_STATION_MM <= xMm && xMm <= entry.toM! * 1000 + SAME_STATION_MM);
}
