/**
 * Envelopes per second for one rating's live load: the eight vehicles of calc-file.md's example
 * at 25 stations of a 30 m span. Run: `node --import tsx shared/src/engine/live-load/live-load.bench.ts`.
 */
import { liveLoadMomentEnvelope } from './moment-envelope';
import { resolveVehicle } from './vehicle-library';

const RATINGS = 5_000;
const SPAN_LENGTH_MM = 30_000;
const STATION_COUNT = 25;
const vehicles = ['hl93', 'type-3', 'type-3s2', 'type-3-3', 'su4', 'su5', 'su6', 'su7'].map((id) => resolveVehicle(id));
const stationsMm = Array.from({ length: STATION_COUNT }, (_, index) => (SPAN_LENGTH_MM * index) / (STATION_COUNT - 1));

let checksum = 0;
const started = process.hrtime.bigint();
for (let rating = 0; rating < RATINGS; rating++) {
  for (const vehicle of vehicles) {
    const envelope = liveLoadMomentEnvelope({ spanLengthMm: SPAN_LENGTH_MM, stationsMm, vehicle, impactFactor: 0.33 });
    checksum += envelope[STATION_COUNT >> 1]!.totalMomentNmm;
  }
}
const seconds = Number(process.hrtime.bigint() - started) / 1e9;
const envelopesPerSecond = (RATINGS * vehicles.length) / seconds;
// The checksum is printed so the engine cannot discard the loop as unused work.
console.log(`liveLoadMomentEnvelope  ${envelopesPerSecond.toFixed(0).padStart(8)} envelopes/s of ${STATION_COUNT} stations`);
console.log(`one rating's live load  ${(RATINGS / seconds).toFixed(0).padStart(8)} ratings/s (${vehicles.length} vehicles)  (checksum ${(checksum / 1e9).toFixed(0)})`);
