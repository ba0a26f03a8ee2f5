/**
 * Design lanes, AASHTO LRFD Art. 3.6.1.1.1: INT(w/12.0) lanes of 12 ft; roadways 20–24 ft
 * wide carry two lanes of w/2. Multiple presence, Table 3.6.1.1.2-1: 1.20, 1.00, 0.85, 0.65.
 */
import { describe, expect, it } from 'vitest';
import { DeckInputError, DESIGN_LANE_WIDTH, designLanes, fromUs, multiplePresenceFactor } from '../../../shared/index.js';

describe('designLanes', () => {
  it('counts INT(w/12) lanes of 12 ft', () => {
    expect(DESIGN_LANE_WIDTH).toBeRelativelyClose(3.6576, 1e-12);
    expect(designLanes(fromUs.ft(12)).count).toBe(1);
    expect(designLanes(fromUs.ft(19.99)).count).toBe(1);
    expect(designLanes(fromUs.ft(36)).count).toBe(3); // exactly three lanes after unit conversion
    expect(designLanes(fromUs.ft(47.9)).count).toBe(3);
    expect(designLanes(fromUs.ft(52)).count).toBe(4);
    expect(designLanes(fromUs.ft(52)).width).toBeRelativelyClose(fromUs.ft(12), 1e-12);
  });
  it('gives two lanes of w/2 from 20 ft to 24 ft', () => {
    for (const w of [20, 22, 24]) {
      const r = designLanes(fromUs.ft(w));
      expect(r.count).toBe(2);
      expect(r.width).toBeRelativelyClose(fromUs.ft(w / 2), 1e-12);
      expect(r.trace.article).toMatch(/3\.6\.1\.1\.1/);
    }
    expect(designLanes(fromUs.ft(24.5)).count).toBe(2);
    expect(designLanes(fromUs.ft(24.5)).width).toBeRelativelyClose(fromUs.ft(12), 1e-12);
  });
  it('refuses a roadway narrower than one lane with a typed error', () => {
    expect(() => designLanes(fromUs.ft(11.9))).toThrow(DeckInputError);
    expect(() => designLanes(Number.NaN)).toThrow(DeckInputError);
  });
});

describe('multiplePresenceFactor', () => {
  it('follows Table 3.6.1.1.2-1', () => {
    expect([1, 2, 3, 4, 6].map(multiplePresenceFactor)).toEqual([1.2, 1.0, 0.85, 0.65, 0.65]);
    expect(() => multiplePresenceFactor(0)).toThrow(DeckInputError);
    expect(() => multiplePresenceFactor(1.5)).toThrow(DeckInputError);
  });
});
