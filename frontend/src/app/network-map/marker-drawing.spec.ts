import { MARKER_HIT_TOLERANCE_PX, MarkerPositions, MarkerStamp, ShapeContext, drawMarker, markerAt, markerDrawing, stampMarkers, stampSize } from './marker-drawing';
import { MarkerLook, markerStyle } from './marker-look';
import { MARK_HALO, MARK_LINE_WEIGHT } from './marker-shapes';

const PLAIN: MarkerLook = { shape: 'circle', fillColor: '#31688e', belowOne: false, selected: false };
const POSTED: MarkerLook = { ...PLAIN, shape: 'diamond' };
const BELOW_ONE: MarkerLook = { ...PLAIN, fillColor: '#440154', belowOne: true };
const SELECTED: MarkerLook = { ...PLAIN, selected: true };

function positions(points: readonly [number, number][]): MarkerPositions {
  return { x: Float64Array.from(points.map(([x]) => x)), y: Float64Array.from(points.map(([, y]) => y)) };
}

/** A 2D context that writes down what is drawn, with the style in force at each fill and stroke. */
function recordingContext(): { ctx: ShapeContext; calls: string[] } {
  const calls: string[] = [];
  const ctx = {
    fillStyle: '',
    strokeStyle: '',
    lineWidth: 0,
    globalAlpha: 1,
    lineCap: 'butt',
    lineJoin: 'miter',
    beginPath: () => calls.push('beginPath'),
    moveTo: (x: number, y: number) => calls.push(`moveTo ${x} ${y}`),
    lineTo: (x: number, y: number) => calls.push(`lineTo ${x} ${y}`),
    arc: (x: number, y: number, radius: number) => calls.push(`arc ${x} ${y} ${radius}`),
    closePath: () => calls.push('closePath'),
    fill: () => calls.push(`fill ${ctx.fillStyle} alpha ${ctx.globalAlpha}`),
    stroke: () => calls.push(`stroke ${String(ctx.strokeStyle)} width ${ctx.lineWidth}`),
  };
  return { ctx: ctx as unknown as ShapeContext, calls };
}

describe('markerDrawing', () => {
  it('makes one batch per look, in the order looks first come, and knows each marker\'s batch', () => {
    const drawing = markerDrawing([PLAIN, POSTED, PLAIN, { ...PLAIN }, POSTED]);
    expect(drawing.batches.map((batch) => batch.look.shape)).toEqual(['circle', 'diamond']);
    expect(drawing.batches[0]!.style).toEqual(markerStyle(PLAIN));
    expect([...drawing.batchOf]).toEqual([0, 1, 0, 0, 1]);
  });

  it('draws plain markers first, as listed, then those below 1.00, and the selected one last', () => {
    const drawing = markerDrawing([SELECTED, BELOW_ONE, PLAIN, POSTED, BELOW_ONE, PLAIN]);
    expect([...drawing.order]).toEqual([2, 3, 5, 1, 4, 0]);
  });

  it('draws nothing for no markers', () => {
    const drawing = markerDrawing([]);
    expect(drawing.batches).toEqual([]);
    expect(drawing.order).toHaveLength(0);
  });
});

describe('drawMarker', () => {
  it('fills the outline in the look\'s colour and opacity, then strokes it once in the outline colour', () => {
    const { ctx, calls } = recordingContext();
    const style = markerStyle(PLAIN);
    drawMarker(ctx, PLAIN, style, 10, 10);
    expect(calls).toEqual([
      'beginPath',
      `moveTo ${10 + style.radius} 10`,
      `arc 10 10 ${style.radius}`,
      `fill ${style.fillColor} alpha ${style.fillOpacity}`,
      `stroke ${style.color} width ${style.weight}`,
      'beginPath',
    ]);
  });

  it('crosses a closed structure\'s square with a light halo under a line in the outline colour', () => {
    const { ctx, calls } = recordingContext();
    const look: MarkerLook = { ...PLAIN, shape: 'crossed-square' };
    const style = markerStyle(look);
    drawMarker(ctx, look, style, 0, 0);
    expect(calls.filter((call) => call.startsWith('fill') || call.startsWith('stroke'))).toEqual([
      `fill ${style.fillColor} alpha ${style.fillOpacity}`,
      `stroke ${style.color} width ${style.weight}`,
      `stroke ${MARK_HALO.color} width ${MARK_HALO.weight}`,
      `stroke ${style.color} width ${MARK_LINE_WEIGHT}`,
    ]);
  });
});

describe('stampSize', () => {
  it('leaves room for the outline\'s stroke around the shape, in whole pixels either side', () => {
    for (const look of [PLAIN, POSTED, BELOW_ONE, SELECTED, { ...PLAIN, shape: 'crossed-square' } as const]) {
      const style = markerStyle(look);
      const size = stampSize(style);
      expect(size / 2).toBeGreaterThanOrEqual(style.radius + style.weight / 2 + 1);
      expect(Number.isInteger(size / 2)).toBe(true);
    }
  });
});

describe('stampMarkers', () => {
  const stamps: MarkerStamp[] = [
    { image: 'plain' as unknown as CanvasImageSource, size: 20 },
    { image: 'posted' as unknown as CanvasImageSource, size: 24 },
    { image: 'below-one' as unknown as CanvasImageSource, size: 22 },
  ];

  function stamped(points: readonly [number, number][], pixelRatio = 1): string[] {
    const calls: string[] = [];
    const ctx = { drawImage: (image: unknown, x: number, y: number, w: number, h: number) => calls.push(`${String(image)} ${x} ${y} ${w}x${h}`) };
    const drawing = markerDrawing([PLAIN, POSTED, BELOW_ONE]);
    stampMarkers(ctx as unknown as Pick<CanvasRenderingContext2D, 'drawImage'>, drawing, stamps, positions(points), { width: 100, height: 80, pixelRatio });
    return calls;
  }

  it('stamps each marker with its look, centred on it, in drawing order', () => {
    expect(stamped([[50, 40], [30, 20], [70, 60]])).toEqual(['plain 40 30 20x20', 'posted 18 8 24x24', 'below-one 59 49 22x22']);
  });

  it('lands stamps on whole device pixels', () => {
    expect(stamped([[50.4, 40.6], [30, 20], [70.2, 60]])).toEqual(['plain 40 31 20x20', 'posted 18 8 24x24', 'below-one 59 49 22x22']);
    expect(stamped([[50.3, 40], [30, 20], [70, 60]], 2)).toEqual(['plain 40.5 30 20x20', 'posted 18 8 24x24', 'below-one 59 49 22x22']);
  });

  it('skips markers wholly outside the canvas and keeps those reaching into it', () => {
    expect(stamped([[-10, 40], [30, -12], [110, 60]])).toEqual(['below-one 99 49 22x22']);
  });
});

describe('markerAt', () => {
  const drawing = markerDrawing([PLAIN, PLAIN, SELECTED]);
  const placed = positions([
    [100, 100],
    [112, 100],
    [300, 300],
  ]);
  const plainReach = markerStyle(PLAIN).radius + markerStyle(PLAIN).weight / 2 + MARKER_HIT_TOLERANCE_PX;

  it('answers the nearest marker whose outline, with the tolerance, reaches the point', () => {
    expect(markerAt(drawing, placed, 104, 101)).toBe(0);
    expect(markerAt(drawing, placed, 109, 99)).toBe(1);
  });

  it('answers null where no marker reaches', () => {
    expect(markerAt(drawing, placed, 100 - plainReach - 0.5, 100)).toBeNull();
    expect(markerAt(drawing, placed, 200, 200)).toBeNull();
  });

  it('reaches as far as the marker is drawn: the selected one further than a plain one', () => {
    expect(markerAt(drawing, placed, 100 - plainReach + 0.5, 100)).toBe(0);
    expect(markerAt(drawing, placed, 300 + plainReach + 2, 300)).toBe(2);
  });

  it('picks the marker drawn last of two in the same place', () => {
    const stacked = positions([
      [50, 50],
      [50, 50],
    ]);
    expect(markerAt(markerDrawing([SELECTED, PLAIN]), stacked, 50, 50)).toBe(0);
    expect(markerAt(markerDrawing([PLAIN, PLAIN]), stacked, 50, 50)).toBe(1);
  });
});
