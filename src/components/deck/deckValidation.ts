/**
 * Validation of a deck draft as the user types: the shared zod schema first (every field and
 * rule it names), then the geometry the solver needs (a roadway between the barriers at
 * least one design lane wide). Returns the parsed deck when everything holds.
 */
import { DeckInputError, parseDeck, type Deck, type DeckIssue } from '@shared/deck/schema';
import { deckGeometry } from '@shared/deck/geometry';
import { designLanes } from '@shared/lrfd/lanes';
import { designValuesOf } from '@shared/loads/designValues';
import { pathKey } from './deckPaths';

export interface DeckValidation {
  deck: Deck | null;
  issues: DeckIssue[];
  /** Messages per field key ('section.area'). */
  byField: Map<string, string[]>;
}

export function validateDeck(draft: unknown): DeckValidation {
  const parsed = parseDeck(draft);
  let deck: Deck | null = null;
  let issues: DeckIssue[];
  if (!parsed.ok) {
    issues = parsed.issues;
  } else {
    issues = [];
    try {
      const geometry = deckGeometry(parsed.deck);
      designLanes(geometry.roadwayWidth, designValuesOf(parsed.deck));
      deck = parsed.deck;
    } catch (error) {
      if (!(error instanceof DeckInputError)) throw error;
      issues = error.issues;
    }
  }
  const byField = new Map<string, string[]>();
  for (const issue of issues) {
    const key = pathKey(issue.path);
    const list = byField.get(key);
    if (list) list.push(issue.message);
    else byField.set(key, [issue.message]);
  }
  return { deck, issues, byField };
}

/** The editor panel that holds a field (by the first part of its path). */
export type EditorPanel =
  | 'general'
  | 'girders'
  | 'roadway'
  | 'slab'
  | 'section'
  | 'materials'
  | 'spans'
  | 'diaphragms'
  | 'policy';

export function panelOf(path: readonly (string | number)[]): EditorPanel {
  const head = String(path[0] ?? '');
  switch (head) {
    case 'name':
    case 'sectionType':
      return 'general';
    case 'girders':
      return 'girders';
    case 'overhangLeft':
    case 'overhangRight':
    case 'barrierLeft':
    case 'barrierRight':
    case 'roadwayWidth':
      return 'roadway';
    case 'slab':
      return 'slab';
    case 'section':
      return 'section';
    case 'materials':
      return 'materials';
    case 'spans':
    case 'supports':
    case 'continuous':
      return 'spans';
    case 'diaphragms':
      return 'diaphragms';
    default:
      return 'policy';
  }
}

/** Plain words for a field path, for the problem summary ("girder offsets, girder 3"). */
export function describePath(path: readonly (string | number)[]): string {
  const names: Record<string, string> = {
    name: 'Deck name',
    sectionType: 'Cross-section type',
    girders: 'Girders',
    overhangLeft: 'Left overhang',
    overhangRight: 'Right overhang',
    barrierLeft: 'Left barrier',
    barrierRight: 'Right barrier',
    roadwayWidth: 'Roadway',
    designValues: 'Design values',
    slab: 'Slab',
    section: 'Girder section',
    materials: 'Materials',
    spans: 'Spans',
    supports: 'Supports',
    diaphragms: 'Diaphragms',
    policy: 'Policies',
    loadModifiers: 'Load modifiers',
    refinedLoading: 'Loads of the refined analysis',
  };
  const head = String(path[0] ?? '');
  const rest = path.slice(1).map((p) => (typeof p === 'number' ? `#${p + 1}` : p));
  return [names[head] ?? head, ...rest].join(' › ');
}
