/**
 * Operations per second of integrateOverBand on a bulb-tee's compression zone, the inner call of
 * strain compatibility. Run: node --import tsx shared/src/engine/geometry/band-integration.bench.ts
 */
import { shapeToPolygons } from '../section';
import { integrateOverBand } from './band-integration';

// a bulb-tee width profile, 1800 mm deep
const [bulbTee] = shapeToPolygons({
  shape: 'profile',
  widthsMm: [[0, 650], [140, 650], [290, 155], [1610, 155], [1650, 400], [1700, 1200], [1800, 1200]],
});
const parabolicStressMpa = (yMm: number) => {
  const ratio = (1800 - yMm) / 250;
  return (2 * 36 * ratio) / (1 + ratio * ratio);
};

const calls = 1_000_000;
let checksum = 0;
const start = process.hrtime.bigint();
for (let i = 0; i < calls; i++) {
  const neutralAxisYMm = 1400 + (i % 300);
  checksum += integrateOverBand(bulbTee!, neutralAxisYMm, 1800, parabolicStressMpa).forceN;
}
const seconds = Number(process.hrtime.bigint() - start) / 1e9;
const opsPerSecond = Math.round(calls / seconds).toLocaleString('en');
// the checksum keeps the loop from being optimised away
console.log(`integrateOverBand, bulb-tee compression zone: ${opsPerSecond} ops/s (checksum ${checksum.toExponential(3)})`);
