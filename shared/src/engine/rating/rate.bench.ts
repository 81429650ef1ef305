/**
 * Full ratings per second on one core, from a checked file to the summary: the damaged interior
 * girder line of the examples (8 vehicles, at least 21 stations) without the strand-loss margin,
 * and the harped girder with a break with it. Run through `npm run bench`.
 */
import fs from 'node:fs';
import path from 'node:path';
import { parseRateFile } from '../calc-file/rate-file';
import { rateGirderLine } from './rate';

function benchmark(exampleName: string, label: string, options: Parameters<typeof rateGirderLine>[1]): void {
  const examplePath = path.resolve(__dirname, `../../../../examples/rate/${exampleName}.json`);
  const parsed = parseRateFile(JSON.parse(fs.readFileSync(examplePath, 'utf8')));
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; '));
  const file = parsed.file;
  const first = rateGirderLine(file, options);
  let checksum = 0;
  for (let i = 0; i < 10; i++) checksum += rateGirderLine(file, options).stations.length;
  const started = process.hrtime.bigint();
  const deadline = started + 3_000_000_000n;
  let ratings = 0;
  while (process.hrtime.bigint() < deadline) {
    checksum += rateGirderLine(file, options).summary.controlling.length;
    ratings += 1;
  }
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  const margin = first.summary.strandLossMargin?.count;
  console.log(
    `${label} (${file.vehicles.length} vehicles, ${first.stations.length} stations${margin !== undefined ? `, margin ${margin} strands` : ''}): ` +
      `${Math.round(ratings / seconds)} ratings/s  (checksum ${checksum})`,
  );
}

benchmark('interior-girder-damaged', 'full rating, damaged girder line, no margin', { withoutMargin: true });
benchmark('harped-girder-with-break', 'full rating, harped girder with a break, with the strand-loss margin', {});
