/**
 * Section properties of a welded steel I girder from its plates, against a hand computation
 * (parallel-axis theorem, written out below) and the closed form of a doubly symmetric I.
 */
import { describe, expect, it } from 'vitest';
import { DeckInputError } from '@shared/deck/schema';
import { builtUpISection } from '@/components/deck/builtUpSection';

describe('builtUpISection', () => {
  it('matches a hand computation of an unsymmetric plate girder (inches)', () => {
    // Top flange 16 × 1, web 60 × 9/16, bottom flange 18 × 1 3/8 (in). Hand computation:
    //   areas 16, 33.75, 24.75 → A = 74.5 in²
    //   centroids below top 0.5, 31, 61.6875 → ȳ = (8 + 1046.25 + 1526.765625) / 74.5 = 34.6445 in
    //   own I 1.3333, 10125, 3.8994; A·d² 18653.56, 448.28, 18100.26 → I = 47332.3 in⁴
    //   J ≈ (16·1³ + 60·0.5625³ + 18·1.375³) / 3 = 24.49 in⁴
    const p = builtUpISection({
      topFlange: { width: 16, thickness: 1 },
      web: { width: 60, thickness: 0.5625 },
      bottomFlange: { width: 18, thickness: 1.375 },
    });
    expect(p.area).toBeRelativelyClose(74.5, 1e-12);
    expect(p.centroidFromTop).toBeRelativelyClose(34.6445, 1e-5);
    expect(p.inertia).toBeRelativelyClose(47332.3, 1e-5);
    expect(p.depth).toBeRelativelyClose(62.375, 1e-12);
    expect(p.torsion).toBeRelativelyClose(24.4906, 1e-5);
  });

  it('gives the closed form (B·H³ − (B − tw)·hw³)/12 for a doubly symmetric I, centroid at mid-depth', () => {
    // Closed form for a doubly symmetric I section (hand derivation: outer rectangle minus the
    // two side voids). B = 0.4 m, tf = 0.03 m, hw = 1.2 m, tw = 0.015 m, H = 1.26 m.
    const B = 0.4, tf = 0.03, hw = 1.2, tw = 0.015, H = hw + 2 * tf;
    const p = builtUpISection({
      topFlange: { width: B, thickness: tf },
      web: { width: hw, thickness: tw },
      bottomFlange: { width: B, thickness: tf },
    });
    expect(p.centroidFromTop).toBeRelativelyClose(H / 2, 1e-12);
    expect(p.inertia).toBeRelativelyClose((B * H ** 3 - (B - tw) * hw ** 3) / 12, 1e-12);
    expect(p.area).toBeRelativelyClose(2 * B * tf + hw * tw, 1e-12);
  });

  it('refuses a plate that is not a positive number, naming the plate', () => {
    const bad = () =>
      builtUpISection({
        topFlange: { width: 0.4, thickness: 0.03 },
        web: { width: Number.NaN, thickness: 0.015 },
        bottomFlange: { width: 0.4, thickness: 0.03 },
      });
    expect(bad).toThrow(DeckInputError);
    expect(bad).toThrow(/web depth must be a number greater than 0/);
    expect(() =>
      builtUpISection({
        topFlange: { width: 0.4, thickness: -0.03 },
        web: { width: 1.2, thickness: 0.015 },
        bottomFlange: { width: 0.4, thickness: 0.03 },
      }),
    ).toThrow(/top flange thickness/);
  });
});
