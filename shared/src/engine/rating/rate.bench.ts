/**
 * Full ratings per second on one core: the damaged interior girder line of the examples
 * (8 vehicles, at least 21 stations), from a checked file to the summary. Run through `npm run bench`.
 */
import fs from 'node:fs';
import path from 'node:path';
import { parseRateFile } from '../calc-file/rate-file';
import { rateGirderLine } from './rate';

const examplePath = path.resolve(__dirname, '../../../../examples/rate/interior-girder-damaged.json');
const parsed = parseRateFile(JSON.parse(fs.readFileSync(examplePath, 'utf8')));
if (!parsed.ok) throw new Error(parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; '));
const file = parsed.file;
const first = rateGirderLine(file);

let checksum = 0;
for (let i = 0; i < 50; i++) checksum += rateGirderLine(file).stations.length;
const started = process.hrtime.bigint();
const deadline = started + 3_000_000_000n;
let ratings = 0;
while (process.hrtime.bigint() < deadline) {
  checksum += rateGirderLine(file).summary.controlling.length;
  ratings += 1;
}
const seconds = Number(process.hrtime.bigint() - started) / 1e9;
console.log(
  `full rating, damaged girder line (${file.vehicles.length} vehicles, ${first.stations.length} stations): ` +
    `${Math.round(ratings / seconds)} ratings/s  (checksum ${checksum})`,
);
