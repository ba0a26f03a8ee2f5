/**
 * The deck open in the workspace: the editable draft (internal SI units, whatever the user's
 * display units), its validation, the lane and wheel placement being studied, and the saved
 * versions of the deck. The unit system here only changes what is shown.
 */
import { defineStore } from 'pinia';
import { computed, reactive, ref, shallowRef, watch } from 'vue';
import type { DeckInput, DesignValuesName } from '@shared/deck/schema';
import type { UnitSystem } from '@shared/units';
import * as decksApi from '@/api/decks';
import * as projectsApi from '@/api/projects';
import type { DeckSummary, DeckVersion, Page, Project, VersionSummary } from '@/api/types';
import { appendNextPage } from '@/composables/usePagedList';
import { validateDeck } from '@/components/deck/deckValidation';
import { deckTemplate, type DeckTemplateKey } from '@/components/deck/deckTemplates';
import { getAt, pathKey, setAt, type FieldPath } from '@/components/deck/deckPaths';

/** The vehicles a placement can carry. */
export type VehicleKey = 'design truck' | 'design tandem' | 'fatigue truck';
/** The effects a girder is studied for in the workspace. */
export type StudyEffect = 'moment' | 'shear';

/** One loaded lane (same fields as shared/placement's LanePlacement). */
export interface WorkspaceLane {
  /** y of the lane's left edge, m from girder 1. */
  left: number;
  /** Left wheel line's distance from the lane's left edge, m. */
  wheelOffset: number;
  /** x of the front axle, m along girder 1 from support line 0. */
  frontAxleAt?: number;
  /** +1 toward increasing x, −1 toward decreasing x. */
  direction?: 1 | -1;
  /** The design truck's variable rear spacing, m. */
  axleSpacing?: number;
}

/** What is saved with a version as its `placements`. */
export interface SavedPlacements {
  format: 'deckshare-placements-1';
  vehicle: VehicleKey;
  lanes: WorkspaceLane[];
  studied: { girder: number; effect: StudyEffect };
  /** Each girder's share (lanes per girder) of this placement for the studied effect, as shown when saved. */
  shares?: Partial<Record<StudyEffect, number[]>>;
  /** Governing (grillage) values per girder of the studied vehicle, as shown when saved (null: not yet found). */
  governing?: Partial<Record<StudyEffect, (number | null)[]>>;
}

export function isSavedPlacements(value: unknown): value is SavedPlacements {
  return (
    typeof value === 'object' &&
    value !== null &&
    (value as { format?: unknown }).format === 'deckshare-placements-1' &&
    Array.isArray((value as { lanes?: unknown }).lanes)
  );
}

export type WorkspaceMode = 'new' | 'edit' | 'read-only';

/** The design values a deck created in a project of these units starts with (shared/loads/designValues.ts). */
export function designValuesForUnits(system: UnitSystem): DesignValuesName {
  return system === 'SI' ? 'si-edition' : 'us-customary';
}

/** The name a new deck is computed under until the user names it (never saved). */
export const UNNAMED_DECK = 'New deck (not named yet)';

export const useDeckStore = defineStore('deck', () => {
  /** The deck being edited, internal units. Number fields may hold NaN/undefined while typed. */
  const draft = ref<DeckInput>(deckTemplate('precast-one-span').build());
  /** Display unit system (converts what is shown, never what is stored). */
  const units = ref<UnitSystem>('US');

  const validation = computed(() => validateDeck(draft.value));
  const issues = computed(() => validation.value.issues);
  /** Whether the draft can be saved (every field, its name included). */
  const valid = computed(() => validation.value.deck !== null);
  /**
   * The draft as the solver and the views take it: a deck needs a name to be saved, not to be
   * computed, so a new deck whose name is still empty is computed as UNNAMED_DECK.
   */
  const computableValidation = computed(() => (draft.value.name?.trim() ? validation.value : validateDeck({ ...draft.value, name: UNNAMED_DECK })));
  /** Whether the draft can be computed (its name aside). */
  const computable = computed(() => computableValidation.value.deck !== null);
  /** The last deck that could be computed: what the 3D view and the solver show. */
  const lastValidDeck = shallowRef(computableValidation.value.deck);
  watch(
    () => computableValidation.value.deck,
    (deck) => {
      if (deck) lastValidDeck.value = deck;
    },
  );

  function messagesFor(path: FieldPath): string[] {
    return validation.value.byField.get(pathKey(path)) ?? [];
  }
  function valueAt(path: FieldPath): unknown {
    return getAt(draft.value, path);
  }
  function setField(path: FieldPath, value: unknown): void {
    if (mode.value === 'read-only') return;
    setAt(draft.value, path, value);
  }

  // ---- where the deck came from -------------------------------------------------------
  const mode = ref<WorkspaceMode>('new');
  const projectId = ref<number | null>(null);
  /** The project the deck belongs to (name and preferred units). */
  const project = ref<Project | null>(null);
  const deckId = ref<number | null>(null);
  const summary = ref<DeckSummary | null>(null);
  const versions = ref<VersionSummary[]>([]);
  /** The last page of versions fetched: the total and the cursor of older ones. */
  const versionsPage = ref<Page | null>(null);
  /** The version opened (read-only) or the one the draft started from. */
  const version = ref<DeckVersion | null>(null);
  /** The version a save will name as its base. */
  const basedOnVersionId = ref<number | null>(null);
  /** JSON of the deck as opened or last saved, to tell whether there are unsaved edits. */
  const savedJson = ref<string | null>(null);
  const dirty = computed(() => savedJson.value === null || savedJson.value !== JSON.stringify(draft.value));
  const saving = ref(false);
  const versionCache = new Map<string, DeckVersion>();

  // ---- placement ----------------------------------------------------------------------
  const vehicle = ref<VehicleKey>('design truck');
  const lanes = ref<WorkspaceLane[]>([]);
  const studied = reactive<{ girder: number; effect: StudyEffect }>({ girder: 0, effect: 'moment' });
  /** Placement restored from a saved version, applied once the solver knows the rules. */
  const pendingPlacement = shallowRef<SavedPlacements | null>(null);

  function resetPlacement(): void {
    lanes.value = [];
    studied.girder = 0;
    studied.effect = 'moment';
    vehicle.value = 'design truck';
  }

  /** The starting deck the draft came from (a typed name is kept when another is chosen). */
  const templateKey = ref<DeckTemplateKey>('precast-one-span');

  function startNew(forProject: number, system: UnitSystem, template: DeckTemplateKey = 'precast-one-span'): void {
    projectId.value = forProject;
    deckId.value = null;
    summary.value = null;
    versions.value = [];
    versionsPage.value = null;
    version.value = null;
    basedOnVersionId.value = null;
    // a new deck's name starts empty: the user names it (the template's name is no name of theirs);
    // its design values follow the project's units (SI edition in an SI project), and it keeps
    // them from then on, written on every version it is saved as
    draft.value = { ...deckTemplate(template).build(), name: '', designValues: designValuesForUnits(system) };
    lastValidDeck.value = computableValidation.value.deck;
    templateKey.value = template;
    units.value = system;
    savedJson.value = null;
    mode.value = 'new';
    pendingPlacement.value = null;
    resetPlacement();
  }

  /** Starts an unsaved draft in the project from a given deck (a study's point): nothing is saved until the user saves. */
  function startFromDeck(forProject: number, system: UnitSystem, deck: DeckInput): void {
    startNew(forProject, system);
    draft.value = JSON.parse(JSON.stringify(deck)) as DeckInput;
    lastValidDeck.value = computableValidation.value.deck;
    resetPlacement();
  }

  /** Starts the draft from another template; the name typed so far (or none) is kept. */
  function useTemplate(template: DeckTemplateKey): void {
    if (mode.value === 'read-only') return;
    const { name, designValues } = draft.value;
    draft.value = { ...deckTemplate(template).build(), name, designValues: designValues ?? 'us-customary' };
    // another starting deck: what was computed before belongs to the deck left behind
    lastValidDeck.value = computableValidation.value.deck;
    templateKey.value = template;
    resetPlacement();
  }

  /** Loads the deck's project (for its name and preferred units). */
  async function loadProject(id: number): Promise<Project> {
    if (project.value?.id === id) return project.value;
    project.value = await projectsApi.getProject(id);
    return project.value;
  }

  /** A saved version (cached); `withResults` also brings its stored results' data. */
  async function fetchVersion(forDeck: number, number: number, withResults = false): Promise<DeckVersion> {
    const key = `${forDeck}:${number}${withResults ? ':results' : ''}`;
    const cached = versionCache.get(key);
    if (cached) return cached;
    const v = await decksApi.getVersion(forDeck, number, withResults);
    // Withheld results are shown once the trainee submits: ask again next time.
    if (!v.resultsWithheld) versionCache.set(key, v);
    return v;
  }

  async function refreshDeck(forDeck: number): Promise<void> {
    const answer = await decksApi.getDeck(forDeck);
    summary.value = answer.deck;
    versions.value = answer.versions;
    versionsPage.value = answer.page;
    projectId.value = answer.deck.projectId;
  }

  /** Appends the next page of older versions to the history. */
  async function fetchOlderVersions(): Promise<void> {
    const forDeck = deckId.value;
    if (forDeck === null) return;
    await appendNextPage(versions, versionsPage, async (cursor) => {
      const answer = await decksApi.listVersions(forDeck, cursor);
      return { rows: answer.versions, page: answer.page };
    });
  }

  function applyVersion(v: DeckVersion, asMode: WorkspaceMode): void {
    version.value = v;
    draft.value = JSON.parse(JSON.stringify(v.deck)) as DeckInput;
    savedJson.value = JSON.stringify(draft.value);
    mode.value = asMode;
    basedOnVersionId.value = asMode === 'edit' ? v.id : null;
    resetPlacement();
    pendingPlacement.value = isSavedPlacements(v.placements) ? v.placements : null;
    if (pendingPlacement.value) {
      vehicle.value = pendingPlacement.value.vehicle;
      studied.girder = pendingPlacement.value.studied.girder;
      studied.effect = pendingPlacement.value.studied.effect;
    }
  }

  /**
   * Opens a deck: a given version read-only, or (without `number`) the latest version as the
   * start of a new one.
   */
  async function open(forDeck: number, number?: number, system?: UnitSystem): Promise<void> {
    deckId.value = forDeck;
    await refreshDeck(forDeck);
    const n = number ?? versions.value[0]?.number;
    if (n === undefined) throw new Error(`deck ${forDeck} has no saved version`);
    const v = await fetchVersion(forDeck, n);
    applyVersion(v, number === undefined ? 'edit' : 'read-only');
    if (system) units.value = system;
  }

  /** Makes the opened (read-only) version the start of a new one. */
  function startFromOpenVersion(): void {
    if (!version.value) return;
    mode.value = 'edit';
    basedOnVersionId.value = version.value.id;
  }

  function placementsToSave(extra: Pick<SavedPlacements, 'shares' | 'governing'> = {}): SavedPlacements {
    return {
      format: 'deckshare-placements-1',
      vehicle: vehicle.value,
      lanes: lanes.value.map((l) => ({ ...l })),
      studied: { girder: studied.girder, effect: studied.effect },
      ...extra,
    };
  }

  /** Saves the draft as a new version (or a new deck). Returns the saved version. */
  async function save(message: string, extra: Pick<SavedPlacements, 'shares' | 'governing'> = {}): Promise<DeckVersion> {
    if (mode.value === 'read-only') throw new Error('this version is open read-only; start a new version from it first');
    if (!validation.value.deck) throw new Error('the deck has problems to fix before it can be saved');
    saving.value = true;
    try {
      // A plain copy of the reactive draft (the deck is JSON data).
      const deck = JSON.parse(JSON.stringify(draft.value)) as DeckInput;
      const placements = placementsToSave(extra);
      let saved: DeckVersion;
      if (deckId.value === null) {
        if (projectId.value === null) throw new Error('no project to save the deck in');
        const created = await decksApi.createDeck(projectId.value, { deck, message, placements });
        deckId.value = created.deck.id;
        saved = created.version;
      } else {
        saved = await decksApi.saveVersion(deckId.value, {
          deck,
          message,
          placements,
          ...(basedOnVersionId.value !== null ? { basedOnVersionId: basedOnVersionId.value } : {}),
        });
      }
      versionCache.set(`${saved.deckId}:${saved.number}`, saved);
      await refreshDeck(saved.deckId);
      version.value = saved;
      basedOnVersionId.value = saved.id;
      savedJson.value = JSON.stringify(draft.value);
      mode.value = 'edit';
      return saved;
    } finally {
      saving.value = false;
    }
  }

  return {
    draft,
    units,
    validation,
    computableValidation,
    computable,
    issues,
    valid,
    lastValidDeck,
    messagesFor,
    valueAt,
    setField,
    mode,
    projectId,
    project,
    loadProject,
    deckId,
    summary,
    versions,
    versionsPage,
    fetchOlderVersions,
    version,
    basedOnVersionId,
    dirty,
    saving,
    vehicle,
    lanes,
    studied,
    pendingPlacement,
    startNew,
    startFromDeck,
    templateKey,
    useTemplate,
    open,
    fetchVersion,
    startFromOpenVersion,
    placementsToSave,
    save,
  };
});
