/**
 * Section properties derived from the deck. Units: internal SI (m, m², m⁴, Pa).
 * eg: distance between the centres of gravity of the girder and of the deck slab
 * (AASHTO LRFD Art. 4.6.2.2.1), taken as centroidFromTop + haunch + ts/2 unless entered.
 * Kg = n·(I + A·eg²), Eq. 4.6.2.2.1-1, with n = E_girder / E_deck (Eq. 4.6.2.2.1-2).
 */
import { fromUs, toUs } from '../units.js';
import { DeckInputError, type Deck, type Material } from './schema.js';

/**
 * Modulus of elasticity, Pa. Concrete per Art. 5.4.2.4: 'current' Ec = 120,000·K1·wc²·f'c^0.33
 * (ksi, kcf; 8th edition and later), or 'pre-2015' Ec = 33,000·K1·wc^1.5·√f'c (earlier editions).
 */
export function modulusOf(material: Material): number {
  if (material.kind === 'modulus') return material.modulus;
  const wc = toUs.kcf(material.unitWeight);
  const fc = toUs.ksi(material.fc);
  const ksi =
    material.modulusEquation === 'pre-2015'
      ? 33000 * material.K1 * wc ** 1.5 * Math.sqrt(fc)
      : 120000 * material.K1 * wc ** 2 * fc ** 0.33;
  return fromUs.ksi(ksi);
}

export interface DerivedSection {
  deckModulus: number;
  girderModulus: number;
  /** n = E_girder / E_deck. */
  modularRatio: number;
  /** eg, m (undefined when the section type does not use it and it cannot be computed). */
  eg?: number;
  /** Kg, m⁴ (undefined when A, I or eg are missing). */
  Kg?: number;
}

export function eccentricityEg(deck: Deck): number | undefined {
  if (deck.section.eg !== undefined) return deck.section.eg;
  if (deck.section.centroidFromTop === undefined) return undefined;
  return deck.section.centroidFromTop + deck.slab.haunch + deck.slab.thickness / 2;
}

export function derivedSection(deck: Deck): DerivedSection {
  const deckModulus = modulusOf(deck.materials.deck);
  const girderModulus = modulusOf(deck.materials.girder);
  const modularRatio = deck.materials.modularRatio ?? girderModulus / deckModulus;
  const eg = eccentricityEg(deck);
  const { area, inertia } = deck.section;
  const Kg = area !== undefined && inertia !== undefined && eg !== undefined ? modularRatio * (inertia + area * eg * eg) : undefined;
  return { deckModulus, girderModulus, modularRatio, eg, Kg };
}

/**
 * Composite transformed section of one girder with a slab flange of width `flangeWidth`, m,
 * transformed into girder material (slab area / n). Returns the composite moment of inertia
 * about the composite centroid, m⁴, in girder-material units.
 */
export function compositeInertia(deck: Deck, flangeWidth: number): number {
  const { area, inertia } = deck.section;
  const eg = eccentricityEg(deck);
  if (area === undefined || inertia === undefined || eg === undefined) {
    throw new DeckInputError(['section'], 'the composite section needs the girder area, moment of inertia and centroid depth');
  }
  const n = derivedSection(deck).modularRatio;
  const ts = deck.slab.thickness;
  const slabArea = (flangeWidth * ts) / n;
  const slabInertia = (flangeWidth * ts ** 3) / 12 / n;
  return inertia + slabInertia + ((area * slabArea) / (area + slabArea)) * eg * eg;
}
