/**
 * The loads a refined (grillage) factor is searched under, by the deck's `refinedLoading`:
 *
 * - 'design-truck' (the default): the design truck alone in every loaded lane (Art. 3.6.1.2.2).
 *   The empirical factors of Art. 4.6.2.2 were calibrated as girder-to-beam-line ratios under
 *   truck loads on refined models (the NCHRP 12-26 study behind them; from memory), so the
 *   truck's ratio is the like-for-like number beside the code's factors.
 * - 'hl93': the HL-93 loading as the code applies it to a girder (Art. 3.6.1.3.1): in every
 *   loaded lane the design truck, or the design tandem (Art. 3.6.1.2.3), each times (1 + IM)
 *   with IM = 33 % (Table 3.6.2.1-1), together with the design lane load, 0.64 klf over a
 *   10 ft width (Art. 3.6.1.2.4) centred on the vehicle and on the lengths that add to the
 *   effect. The same load is on the beam line of the denominator, (1 + IM)·vehicle + lane, so
 *   g × the beam line's LL+IM is the girder's LL+IM, as with the code's factors. Truck and
 *   tandem are two loads of the target: the factor is the largest girder effect over the
 *   largest beam-line effect, and the row names the governing vehicle. For negative moment and
 *   the reactions over interior piers of a continuous deck a third load joins them (Art.
 *   3.6.1.3.1): 90 % of two design trucks (14 ft rear spacings, at least 50 ft from the rear
 *   axle of one to the lead axle of the other), with IM, and 90 % of the lane load.
 * Fatigue is always one fatigue truck without the lane load (Art. 3.6.1.4.1).
 * The vehicles, the lane load and its width and the two-truck spacings are the deck's design
 * values (shared/loads/designValues.ts; the SI edition's: 35/145/145 kN, 2 × 110 kN, 9.3 N/mm
 * over 3000 mm, 4.3 m rear spacings at least 15 m apart).
 * Units: N, m; the lane load N/m.
 */
import { DeckInputError, type RefinedLoading } from '../deck/schema.js';
import type { Vehicle } from '../loads/vehicles.js';
import { citeArticle, US_CUSTOMARY_VALUES, type DesignValues } from '../loads/designValues.js';
import { lengthInText as len } from '../quantities/inText.js';
import { IM_STRENGTH_SERVICE, TWO_TRUCK_REDUCTION, twoDesignTrucks } from '../loads/beamLine.js';
import { influenceLine, maxVehicleEffect, type BeamModel, type BeamResponse } from '../loads/influenceLine.js';
import { uniformLoadEffect } from '../loads/movingLoad.js';
import type { Sense } from '../placement/evaluate.js';
import type { PlacementRules } from '../placement/rules.js';

/** One load a target is searched under: its vehicle in every loaded lane, with or without the lane load. */
export interface TargetLoad {
  vehicle: Vehicle;
  /** The load in a reader's words, for tables ("design truck", "HL-93 truck + lane"). */
  label: string;
  /** The design lane load in every loaded lane (Art. 3.6.1.2.4). */
  laneLoad: boolean;
  /** The lane load's intensity, N/m (the design values' lane load; 90 % of it with two trucks). */
  laneIntensity?: number;
  /** The lane load's transverse width, m (the design values' 10 ft or 3000 mm). */
  laneWidth?: number;
  /** Why this load belongs to the target (trace). */
  reason: string;
}

/** A vehicle with every axle times `factor`, named for it ("design truck × 1.33"). */
function scaled(v: Vehicle, factor: number): Vehicle {
  return { ...v, name: `${v.name} × ${factor.toFixed(2)}`, axles: v.axles.map((a) => ({ ...a, weight: a.weight * factor })) };
}

const WITH_IM = 1 + IM_STRENGTH_SERVICE;
const HL93_WORDS = `with ${Math.round(IM_STRENGTH_SERVICE * 100)} % dynamic load allowance (Table 3.6.2.1-1) and the design lane load (Art. 3.6.1.2.4) in each loaded lane`;
const PIER_WORDS = 'the 90 % two-truck load of Art. 3.6.1.3.1 is not placed on the grillage, the one-truck ratio stands for it';

/**
 * The loads of a strength target (moment, shear, reaction). `overPier`: negative moment or an
 * interior reaction of a continuous deck; `maxHeadway` (m) the longest gap between the two
 * trucks there (long enough for the second truck to leave the girder). `values`: the deck's
 * design values (default the US customary ones).
 */
export function strengthLoads(loading: RefinedLoading, overPier: boolean, maxHeadway = 0, values: DesignValues = US_CUSTOMARY_VALUES): TargetLoad[] {
  if (loading === 'hl93') {
    const lane = { laneLoad: true, laneIntensity: values.laneLoad, laneWidth: values.laneLoadWidth };
    const loads: TargetLoad[] = [
      { vehicle: scaled(values.truck, WITH_IM), label: 'HL-93 truck + lane', ...lane, reason: `one design truck per loaded lane, ${HL93_WORDS}` },
      { vehicle: scaled(values.tandem, WITH_IM), label: 'HL-93 tandem + lane', ...lane, reason: `one design tandem per loaded lane, ${HL93_WORDS}` },
    ];
    if (overPier) {
      const factor = TWO_TRUCK_REDUCTION * WITH_IM;
      const spacings = `${len(values.twoTrucks.rearSpacing)} rear spacings, at least ${len(values.twoTrucks.minHeadway)} apart`;
      loads.push({
        vehicle: { ...scaled(twoDesignTrucks(Math.max(maxHeadway, 1), values), factor), name: `two design trucks × ${factor.toFixed(3)}` },
        label: 'HL-93 90 % of two trucks + lane',
        ...lane,
        laneIntensity: TWO_TRUCK_REDUCTION * values.laneLoad,
        reason: `90 % of two design trucks (${spacings}) with ${Math.round(IM_STRENGTH_SERVICE * 100)} % dynamic load allowance and 90 % of the lane load, per loaded lane (${citeArticle(values, 'Art. 3.6.1.3.1')})`,
      });
    }
    return loads;
  }
  return [{ vehicle: values.truck, label: 'design truck', laneLoad: false, reason: overPier ? `one design truck per loaded lane; ${PIER_WORDS}` : 'one design truck per loaded lane' }];
}

/** One lane of the load on the beam line: the vehicle's extreme plus, with the lane load, q·∫ of the influence line's parts of the sense. */
export function beamLineEffect(beam: BeamModel, response: BeamResponse, load: TargetLoad, sense: Sense): number {
  const line = influenceLine(beam, response);
  const vehicle = maxVehicleEffect(line, load.vehicle, sense).value;
  return load.laneLoad ? vehicle + uniformLoadEffect(line, load.laneIntensity ?? US_CUSTOMARY_VALUES.laneLoad, sense) : vehicle;
}

/** The loading is possible on this roadway: the lane load's width (10 ft, SI edition 3000 mm) fits in a design lane. */
export function assertLoadingFits(loading: RefinedLoading, rules: PlacementRules, values: DesignValues = US_CUSTOMARY_VALUES): void {
  if (loading !== 'hl93' || rules.laneWidth >= values.laneLoadWidth - 1e-9) return;
  throw new DeckInputError(
    ['refinedLoading'],
    `the design lanes of this roadway are ${len(rules.laneWidth)} wide, narrower than the ${len(values.laneLoadWidth)} width of the design lane load (${citeArticle(values, 'Art. 3.6.1.2.4')}): choose 'design-truck' for the refined run`,
  );
}

/** The run's words on its loads (trace). */
export function loadingWords(loading: RefinedLoading): { formula: string; note: string } {
  if (loading === 'hl93') {
    return {
      formula: 'HL-93: (1 + IM)·(design truck or design tandem) + design lane load, in each loaded lane (strength); fatigue truck, one lane, no m (fatigue)',
      note: 'chosen for this deck (refined loading "hl93"): the same load is on the beam line, so g × the beam line\u2019s LL+IM is the girder\u2019s LL+IM; the lane load spreads more evenly across the deck than the truck does and lowers the ratio a little; over interior piers 90 % of two trucks and of the lane load is searched too (Art. 3.6.1.3.1)',
    };
  }
  return {
    formula: 'design truck alone (strength); fatigue truck, one lane, no m (fatigue)',
    note: 'the empirical factors were calibrated as girder-to-beam ratios under truck loads, so the truck alone gives the comparable ratio (refined loading "design-truck", the default)',
  };
}
