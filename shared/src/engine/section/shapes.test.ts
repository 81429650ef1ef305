import { z } from 'zod';
import { sectionShapeSchema } from './shapes';

/** The section as the calculation file nests it, so issue paths read as the file's keys. */
const fileSchema = z.strictObject({ girder: z.strictObject({ section: sectionShapeSchema }) });

function problemsOf(section: unknown): string[] {
  const result = fileSchema.safeParse({ girder: { section } });
  return result.success ? [] : result.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
}

const validSections = {
  rectangle: { shape: 'rectangle', widthMm: 400, depthMm: 900 },
  tee: { shape: 'tee', flangeWidthMm: 1200, flangeThicknessMm: 200, webWidthMm: 250, depthMm: 900 },
  'i-girder': {
    shape: 'i-girder',
    topFlangeWidthMm: 508,
    topFlangeThicknessMm: 203.2,
    topTaperHeightMm: 152.4,
    webWidthMm: 203.2,
    bottomTaperHeightMm: 228.6,
    bottomFlangeWidthMm: 660.4,
    bottomFlangeThicknessMm: 203.2,
    depthMm: 1371.6,
  },
  profile: { shape: 'profile', widthsMm: [[0, 650], [150, 650], [300, 160], [1500, 160], [1600, 1200], [1700, 1200]] },
  box: { shape: 'box', widthMm: 1200, depthMm: 900, voidWidthMm: 900, voidDepthMm: 650, voidBottomMm: 125, voidFilletMm: 75 },
  'voided-slab': { shape: 'voided-slab', widthMm: 1200, depthMm: 450, voidDiameterMm: 250, voidCount: 4, voidCentreYMm: 220 },
  'double-tee': {
    shape: 'double-tee',
    flangeWidthMm: 2400,
    flangeThicknessMm: 100,
    stemSpacingMm: 1200,
    stemTopWidthMm: 200,
    stemBottomWidthMm: 120,
    depthMm: 700,
  },
  polygon: { shape: 'polygon', pointsMm: [[0, 0], [500, 0], [500, 800], [0, 800]], holesMm: [[[100, 100], [400, 100], [250, 400]]] },
} as const;

describe('sectionShapeSchema', () => {
  it.each(Object.entries(validSections))('accepts a sound %s', (_, section) => {
    expect(problemsOf(section)).toEqual([]);
  });

  it('accepts a box without fillets', () => {
    const { voidFilletMm: _fillet, ...withoutFillets } = validSections.box;
    expect(problemsOf(withoutFillets)).toEqual([]);
  });

  it('rejects unknown keys and unknown shapes', () => {
    expect(problemsOf({ ...validSections.rectangle, colour: 'grey' })).toEqual(['girder.section: Unrecognized key: "colour"']);
    expect(problemsOf({ shape: 'hexagon' })[0]).toMatch(/^girder\.section\.shape: /);
  });

  it('names every non-positive dimension', () => {
    expect(problemsOf({ shape: 'rectangle', widthMm: 0, depthMm: -5 })).toEqual([
      'girder.section.widthMm: must be > 0',
      'girder.section.depthMm: must be > 0',
    ]);
    expect(problemsOf({ ...validSections['voided-slab'], voidCount: 2.5 })).toEqual(['girder.section.voidCount: must be a whole number']);
  });

  it.each<[string, Record<string, unknown>, string]>([
    ['tee', { flangeThicknessMm: 900 }, 'girder.section.flangeThicknessMm: flange must be thinner than the depth'],
    ['tee', { webWidthMm: 1300 }, 'girder.section.webWidthMm: web must be no wider than the flange'],
    ['i-girder', { depthMm: 787.4 }, 'girder.section.depthMm: depth must exceed the flanges and tapers stacked (787.4 mm) to leave a web'],
    ['i-girder', { webWidthMm: 550 }, 'girder.section.webWidthMm: web must be no wider than the top flange'],
    ['i-girder', { bottomFlangeWidthMm: 200 }, 'girder.section.webWidthMm: web must be no wider than the bottom flange'],
    ['profile', { widthsMm: [[10, 500], [900, 500]] }, 'girder.section.widthsMm.0.0: the first point must be at y = 0 (the soffit)'],
    ['profile', { widthsMm: [[0, 500], [900, 500], [900, 300]] }, 'girder.section.widthsMm.2.0: y must rise strictly from point to point'],
    ['profile', { widthsMm: [[0, 500], [900, -1]] }, 'girder.section.widthsMm.1.1: must be >= 0'],
    ['profile', { widthsMm: [[0, 0], [900, 0]] }, 'girder.section.widthsMm: the profile must have some width'],
    ['box', { voidWidthMm: 1200 }, 'girder.section.voidWidthMm: void must be narrower than the box'],
    ['box', { voidDepthMm: 775 }, 'girder.section.voidDepthMm: void must end below the top of the box (voidBottomMm + voidDepthMm < depthMm)'],
    ['box', { voidFilletMm: 325 }, 'girder.section.voidFilletMm: fillets must leave a straight part of every void side (2 × voidFilletMm < void width and depth)'],
    ['voided-slab', { voidDiameterMm: 300 }, 'girder.section.voidDiameterMm: voids must be narrower than their spacing (widthMm / voidCount = 300 mm) so they neither overlap nor break through the sides'],
    ['voided-slab', { voidCentreYMm: 330 }, 'girder.section.voidCentreYMm: voids must lie inside the slab depth (voidCentreYMm ± voidDiameterMm / 2)'],
    ['double-tee', { stemSpacingMm: 150 }, 'girder.section.stemSpacingMm: stems must not touch: spacing must exceed the stem width'],
    ['double-tee', { stemSpacingMm: 2300 }, 'girder.section.stemSpacingMm: stems must lie under the flange (stemSpacingMm + stem width <= flangeWidthMm)'],
    ['polygon', { pointsMm: [[0, 0], [500, 0]], holesMm: [] }, 'girder.section.pointsMm: a polygon needs at least 3 points'],
    ['polygon', { pointsMm: [[0, 0], [500, 0], [1000, 0]], holesMm: [] }, 'girder.section.pointsMm: the outline must enclose some area'],
    ['polygon', { pointsMm: [[0, 0], [500, 800], [500, 0], [0, 400]], holesMm: [] }, 'girder.section.pointsMm: the outline must not cross itself'],
    ['polygon', { pointsMm: [[0, 50], [500, 50], [250, 800]], holesMm: [] }, 'girder.section.pointsMm: the lowest point must be at y = 0 (the soffit), not 50'],
    ['polygon', { holesMm: [[[100, 100], [600, 100], [250, 400]]] }, 'girder.section.holesMm.0.1: hole points must lie inside the outline'],
  ])('%s with %j: %s', (shape, change, problem) => {
    const section = { ...validSections[shape as keyof typeof validSections], ...change };
    expect(problemsOf(section)).toEqual([problem]);
  });
});
