/**
 * Runs parameter studies (shared/studies/) on worker threads (server/compute/studyWorker.ts,
 * started as the other pools are, server/compute/workerPool.ts) so that the request thread
 * never computes: the points not yet stored are cut into batches (many code-only points per
 * batch, few when the grillage runs), as many batches run at once as there are threads, and
 * each batch's points are stored as it ends, so a study's finished points are readable while
 * it runs and a finished study is never computed again.
 * - progress: points stored of all, and the time left from this run's rate so far;
 * - cancel: the batches in flight are stopped; finished points stay, the study is 'cancelled';
 * - a server stopped mid-study: at start-up the study is marked 'interrupted' and may be
 *   resumed (only its missing points are computed).
 */
import type { Piscina } from 'piscina';
import { and, eq, inArray } from 'drizzle-orm';
import type { Db } from '../db/client.js';
import { deckVersions, now, studies, studyPoints } from '../db/schema.js';
import { studyPoints as pointsOfSweep, type Sweep } from '../../shared/studies/sweep.js';
import { SOLVER_VERSION } from '../../shared/version.js';
import { tsxWorkerPool } from './workerPool.js';
import type { StudyPointAnswer, StudyTask } from './studyWorker.js';

const WORKER = new URL('./studyWorker.ts', import.meta.url).href;

export interface StudyRunnerOptions {
  threads: number;
  workerMemoryMb: number;
  maxNodeGirders: number;
  /** Code-only points per batch (default 100). */
  codeBatch?: number;
  log?: (line: string) => void;
}

export interface StudyProgress {
  done: number;
  total: number;
  /** Estimated seconds left (null until this run has stored a batch). */
  secondsLeft: number | null;
}

interface LiveStudy {
  controller: AbortController;
  startedAt: number;
  doneAtStart: number;
  done: number;
  total: number;
  finished: Promise<void>;
}

export class StudyRunner {
  private readonly pool: Piscina<StudyTask, StudyPointAnswer[]>;
  private readonly live = new Map<number, LiveStudy>();
  private readonly log: (line: string) => void;

  constructor(private readonly db: Db, private readonly options: StudyRunnerOptions) {
    this.log = options.log ?? ((l) => console.error(l));
    this.pool = tsxWorkerPool<StudyTask, StudyPointAnswer[]>({ file: WORKER, threads: options.threads, queue: 4 * options.threads, workerMemoryMb: options.workerMemoryMb, log: this.log, what: 'study' });
  }

  /** Starts (or resumes) computing the study's missing points; returns at once. */
  start(studyId: number): void {
    if (this.live.has(studyId)) return;
    const study = this.db.select().from(studies).where(eq(studies.id, studyId)).get();
    if (!study) return;
    const version = this.db.select({ deckJson: deckVersions.deckJson }).from(deckVersions).where(eq(deckVersions.id, study.versionId)).get();
    if (!version) return;
    const sweep = JSON.parse(study.sweepJson) as Sweep;
    const stored = new Set(this.db.select({ index: studyPoints.index }).from(studyPoints).where(eq(studyPoints.studyId, studyId)).all().map((r) => r.index));
    const missing = pointsOfSweep(sweep).filter((p) => !stored.has(p.index));
    const size = sweep.grillage === 'none' ? (this.options.codeBatch ?? 100) : sweep.grillage === 'all' ? 1 : 10;
    const batches: StudyTask[] = [];
    for (let i = 0; i < missing.length; i += size) batches.push({ deckJson: version.deckJson, sweep, points: missing.slice(i, i + size), maxNodeGirders: this.options.maxNodeGirders });
    const live: LiveStudy = { controller: new AbortController(), startedAt: performance.now(), doneAtStart: stored.size, done: stored.size, total: study.pointsTotal, finished: Promise.resolve() };
    this.live.set(studyId, live);
    live.finished = this.runBatches(studyId, live, batches).finally(() => this.live.delete(studyId));
  }

  private async runBatches(studyId: number, live: LiveStudy, batches: StudyTask[]): Promise<void> {
    let next = 0;
    const lane = async () => {
      while (next < batches.length && !live.controller.signal.aborted) {
        const task = batches[next++];
        const answers = await this.pool.run(task, { signal: live.controller.signal });
        if (live.controller.signal.aborted) return;
        this.store(studyId, live, answers);
      }
    };
    try {
      await Promise.all(Array.from({ length: Math.min(this.options.threads, batches.length) }, lane));
      if (!live.controller.signal.aborted) this.finish(studyId, 'done');
    } catch (e) {
      if (live.controller.signal.aborted) return;
      this.log(`study ${studyId} stopped: ${e instanceof Error ? e.message : String(e)}`);
      this.finish(studyId, 'interrupted');
    }
  }

  private store(studyId: number, live: LiveStudy, answers: StudyPointAnswer[]): void {
    this.db.transaction((tx) => {
      for (const a of answers) {
        tx.insert(studyPoints)
          .values({ studyId, index: a.index, valuesJson: JSON.stringify(a.values), summaryJson: a.summary ? JSON.stringify(a.summary) : null, error: a.error, solverVersion: SOLVER_VERSION })
          .onConflictDoNothing()
          .run();
      }
      live.done += answers.length;
      tx.update(studies).set({ pointsDone: live.done }).where(eq(studies.id, studyId)).run();
    });
  }

  private finish(studyId: number, state: 'done' | 'interrupted'): void {
    this.db.update(studies).set({ state, finishedAt: state === 'done' ? now : null }).where(and(eq(studies.id, studyId), eq(studies.state, 'running'))).run();
  }

  /** Where a running study is (null when it is not running here). */
  progress(studyId: number): StudyProgress | null {
    const live = this.live.get(studyId);
    if (!live) return null;
    const doneHere = live.done - live.doneAtStart;
    const elapsed = (performance.now() - live.startedAt) / 1000;
    const secondsLeft = doneHere > 0 ? ((live.total - live.done) * elapsed) / doneHere : null;
    return { done: live.done, total: live.total, secondsLeft };
  }

  /** Stops a running study for `byName`: finished points stay; false when it is not running here. */
  cancel(studyId: number, byName: string): boolean {
    const live = this.live.get(studyId);
    if (!live || live.controller.signal.aborted) return false;
    live.controller.abort();
    this.db.update(studies).set({ state: 'cancelled', cancelledBy: byName, finishedAt: now }).where(eq(studies.id, studyId)).run();
    return true;
  }

  /** Resolves when the study's current run has ended (tests). */
  async settled(studyId: number): Promise<void> {
    await this.live.get(studyId)?.finished;
  }

  async close(): Promise<void> {
    for (const l of this.live.values()) l.controller.abort();
    await Promise.allSettled([...this.live.values()].map((l) => l.finished));
    await this.pool.destroy();
  }
}

/** Marks the studies a stopped server left running as interrupted (resumable); returns how many. */
export function interruptStudies(db: Db): number {
  return db.update(studies).set({ state: 'interrupted' }).where(inArray(studies.state, ['running'])).run().changes;
}
