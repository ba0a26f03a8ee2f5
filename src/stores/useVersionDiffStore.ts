/**
 * The comparison of two saved versions of the open deck: which inputs changed, and every factor
 * row of both versions side by side (shared/versionDiff). Each version's factors come from the
 * server (GET …/versions/:n/factors), read from the code and refined results the review summary
 * and the package read; while a version's grillage is still computed on the server, its job is
 * followed (polled) and the rows fill in when it is done. A version whose results are withheld
 * from the reader (an open exercise) has its factors left out, with the reason.
 */
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import * as decksApi from '@/api/decks';
import * as reviewsApi from '@/api/reviews';
import type { ComputeJob, RefinedRefusal } from '@/api/reviews';
import { describeError } from '@/api/http';
import { useDeckStore } from '@/stores/useDeckStore';
import { diffDecks, type InputChange } from '@/components/deck/deckDiff';
import { diffVersionFactors, type FactorDiff } from '@shared/versionDiff/factorDiff';
import type { GrillageMissing, VersionFactors } from '@shared/versionDiff/versionFactors';

/** One version of the comparison: its factors (the grillage part may still be computing) and the job they wait for. */
export interface DiffSide {
  number: number;
  factors: VersionFactors | null;
  job: ComputeJob | null;
  refusal: RefinedRefusal | null;
}

/** Poll interval of a grillage job, ms. */
const POLL_MS = 1000;

export const useVersionDiffStore = defineStore('versionDiff', () => {
  const decks = useDeckStore();
  const comparing = ref(false);
  const error = ref<string | null>(null);
  /** Why the factors are not compared (results withheld from the reader), or null. */
  const withheld = ref<string | null>(null);
  const inputChanges = ref<InputChange[] | null>(null);
  const sides = ref<DiffSide[]>([]);
  /** Each comparison's number: polls of an earlier one stop. */
  let generation = 0;
  const timers = new Set<ReturnType<typeof setTimeout>>();

  const factorDiff = computed<FactorDiff | null>(() => {
    const [a, b] = sides.value;
    if (!a?.factors || !b?.factors) return null;
    return diffVersionFactors({ number: a.number, factors: a.factors }, { number: b.number, factors: b.factors });
  });

  function stop(): void {
    generation++;
    for (const t of timers) clearTimeout(t);
    timers.clear();
  }

  function reset(): void {
    stop();
    comparing.value = false;
    error.value = null;
    withheld.value = null;
    inputChanges.value = null;
    sides.value = [];
  }

  function update(index: number, change: Partial<DiffSide>): void {
    sides.value = sides.value.map((s, i) => (i === index ? { ...s, ...change } : s));
  }

  /** Marks a side's grillage as missing, with the reason, keeping its code part. */
  function grillageMissing(index: number, missing: GrillageMissing, note: string): void {
    const side = sides.value[index];
    if (!side?.factors) return;
    update(index, { factors: { ...side.factors, refined: { available: false, missing, note } } });
  }

  async function fetchSide(gen: number, deckId: number, index: number): Promise<void> {
    const number = sides.value[index].number;
    const answer = await decksApi.getVersionFactors(deckId, number);
    if (gen !== generation) return;
    update(index, { factors: answer.factors, job: answer.job, refusal: answer.refusal });
    if (answer.job) follow(gen, deckId, index, answer.job);
  }

  /** Polls the side's grillage job; loads the side again when it is done, or says why it ended. */
  function follow(gen: number, deckId: number, index: number, job: ComputeJob): void {
    const timer = setTimeout(async () => {
      timers.delete(timer);
      if (gen !== generation) return;
      try {
        const now = await reviewsApi.getJob(job.url);
        if (gen !== generation) return;
        update(index, { job: now });
        if (now.state === 'done') await fetchSide(gen, deckId, index);
        else if (reviewsApi.jobIsLive(now)) follow(gen, deckId, index, now);
        else grillageMissing(index, now.state === 'cancelled' ? 'cancelled' : 'failed', now.error ?? `the grillage job ended ${now.state}`);
      } catch (e) {
        if (gen === generation) grillageMissing(index, 'not-followed', describeError(e));
      }
    }, POLL_MS);
    timers.add(timer);
  }

  /** Compares version `before` with version `after` of deck `deckId`. */
  async function compare(deckId: number, before: number, after: number): Promise<void> {
    reset();
    const gen = generation;
    comparing.value = true;
    try {
      const [a, b] = await Promise.all([decks.fetchVersion(deckId, before), decks.fetchVersion(deckId, after)]);
      if (gen !== generation) return;
      inputChanges.value = diffDecks(a.deck, b.deck);
      // A version under the reader's open exercise: its factors are not compared either.
      const hidden = a.resultsWithheld ?? b.resultsWithheld;
      if (hidden) {
        withheld.value = hidden.message;
        return;
      }
      sides.value = [before, after].map((number) => ({ number, factors: null, job: null, refusal: null }));
      await Promise.all([0, 1].map((i) => fetchSide(gen, deckId, i)));
    } catch (e) {
      if (gen === generation) error.value = describeError(e);
    } finally {
      if (gen === generation) comparing.value = false;
    }
  }

  return { comparing, error, withheld, inputChanges, sides, factorDiff, compare, reset, stop };
});
