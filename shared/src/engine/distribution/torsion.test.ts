import { boxTorsionConstantMm4, rectangleTorsionConstantMm4, torsionConstantMm4, voidedSlabTorsionConstantMm4 } from './torsion';

describe('rectangleTorsionConstantMm4', () => {
  // β of J = β b t³ tabulated for b/t = 1, 2, 10 in Timoshenko & Goodier, Theory of Elasticity,
  // torsion of a rectangular bar: 0.141, 0.229, 0.312 [R — from memory, verify]; ⅓ as b/t grows.
  it.each([
    [1, 0.141],
    [2, 0.229],
    [10, 0.312],
  ])('gives β ≈ tabulated at b/t = %d', (ratio, beta) => {
    const shortMm = 300;
    expect(rectangleTorsionConstantMm4(ratio * shortMm, shortMm) / (ratio * shortMm * shortMm ** 3)).toBeCloseTo(beta, 3);
  });

  it('tends to b t³/3 for a thin strip and does not care which side is which', () => {
    expect(rectangleTorsionConstantMm4(100_000, 100) / ((100_000 * 100 ** 3) / 3)).toBeCloseTo(1, 2);
    expect(rectangleTorsionConstantMm4(1200, 600)).toBe(rectangleTorsionConstantMm4(600, 1200));
  });
});

describe('boxTorsionConstantMm4 (Bredt, 4A₀²/Σ s/t)', () => {
  it('gives 1.0336e11 mm⁴ for a 1200 × 900 box with 150 mm walls all round (hand check from the published formula)', () => {
    // centreline 1050 × 750, A₀ = 787 500 mm²; Σ s/t = 2 × 1050/150 + 2 × 750/150 = 24;
    // J = 4 × 787 500² / 24 = 1.03359375e11
    const box = { shape: 'box', widthMm: 1200, depthMm: 900, voidWidthMm: 900, voidDepthMm: 600, voidBottomMm: 150 } as const;
    expect(boxTorsionConstantMm4(box)).toBeCloseTo(1.03359375e11, -3);
    expect(torsionConstantMm4(box)).toBe(boxTorsionConstantMm4(box));
  });
});

describe('voidedSlabTorsionConstantMm4 (common practice, no source)', () => {
  it('takes the solid rectangle less π D⁴/32 per void', () => {
    const slab = { shape: 'voided-slab', widthMm: 1200, depthMm: 600, voidDiameterMm: 300, voidCount: 3, voidCentreYMm: 300 } as const;
    const voidsMm4 = (3 * Math.PI * 300 ** 4) / 32;
    expect(voidedSlabTorsionConstantMm4(slab)).toBeCloseTo(rectangleTorsionConstantMm4(1200, 600) - voidsMm4, -3);
  });
});
