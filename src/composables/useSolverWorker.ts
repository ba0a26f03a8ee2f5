/**
 * The workspace's link to the solver Web Worker: reactive state for the analysis, the
 * influence surfaces, the governing placements found so far and the live shares of the
 * dragged placement, with progress and cancellation of long work.
 *
 * Evaluations are coalesced: at most one is in flight, and while it runs only the newest
 * placement waits, so a fast drag never builds a queue. Cancel asks the worker to stop at
 * its next step; if a single step (a fine mesh's factorisation) keeps it busy, the worker is
 * terminated and a fresh one started (the analysis must then be run again).
 */
import { onBeforeUnmount, ref, shallowRef } from 'vue';
import type { FactorRow } from '@shared/lrfd/factors';
import type { LanePlacement } from '@shared/placement/rules';
import type {
  AnalyseOptions,
  AnalysisSummary,
  GirderEnvelopeSeries,
  GoverningSummary,
  LiveShares,
  RefinedSummary,
  StudyEffect,
  StudySummary,
  SurfaceGrid,
  VehicleKey,
} from '@/workers/solverCore';
import type { SolverErrorInfo, SolverMessage, SolverRequest } from '@/workers/solverProtocol';

export type SolverStatus = 'idle' | 'working' | 'ready' | 'error' | 'cancelled';

/** An error the solver reported, with the fields and rules it names. */
export class SolverError extends Error {
  readonly issues: { path: (string | number)[]; message: string }[];
  readonly kind: string;
  constructor(info: SolverErrorInfo) {
    super(info.message);
    this.name = 'SolverError';
    this.kind = info.name;
    this.issues = info.issues ?? [];
  }
}

interface Pending {
  resolve: (value: unknown) => void;
  reject: (error: Error) => void;
  onMessage?: (message: SolverMessage) => void;
}

type Distribute<T> = T extends unknown ? Omit<T, 'id'> : never;
type RequestBody = Distribute<SolverRequest>;

export type WorkerFactory = () => Worker;

const defaultFactory: WorkerFactory = () => new Worker(new URL('../workers/solver.worker.ts', import.meta.url), { type: 'module' });

export function useSolverWorker(factory: WorkerFactory = defaultFactory) {
  const status = ref<SolverStatus>('idle');
  const progress = ref<{ phase: string; fraction: number } | null>(null);
  const error = shallowRef<SolverError | null>(null);
  const analysis = shallowRef<AnalysisSummary | null>(null);
  const study = shallowRef<StudySummary | null>(null);
  /** Governing placements of the studied vehicle, per effect and girder, as they are found. */
  const governing = shallowRef<Record<StudyEffect, (GoverningSummary | undefined)[]>>({ moment: [], shear: [] });
  /** The same for the fatigue truck (one lane, no multiple presence), for the comparison. */
  const fatigue = shallowRef<Record<StudyEffect, (GoverningSummary | undefined)[]>>({ moment: [], shear: [] });
  const live = shallowRef<LiveShares | null>(null);
  /** The refined factors of every girder, effect and span, with the comparison to the code. */
  const refined = shallowRef<RefinedSummary | null>(null);
  /** Recent evaluation times in the worker, ms (newest last, at most 200). */
  const evaluateTimes = ref<number[]>([]);

  let worker: Worker | null = null;
  let nextId = 1;
  const pending = new Map<number, Pending>();
  let longJob: number | null = null;

  function spawn(): Worker {
    const w = factory();
    w.onmessage = (event: MessageEvent<SolverMessage>) => receive(event.data);
    w.onerror = (event: ErrorEvent) => {
      event.preventDefault();
      const failure = new SolverError({ name: 'WorkerError', message: event.message || 'the solver stopped unexpectedly' });
      for (const p of pending.values()) p.reject(failure);
      pending.clear();
      error.value = failure;
      status.value = 'error';
      worker?.terminate();
      worker = null;
    };
    return w;
  }

  function ensure(): Worker {
    if (!worker) worker = spawn();
    return worker;
  }

  function receive(message: SolverMessage): void {
    const p = pending.get(message.id);
    if (!p) return;
    if (message.type === 'done') {
      pending.delete(message.id);
      p.resolve(message.result);
    } else if (message.type === 'error') {
      pending.delete(message.id);
      p.reject(new SolverError(message.error));
    } else {
      p.onMessage?.(message);
    }
  }

  function send<T>(body: RequestBody, onMessage?: (m: SolverMessage) => void): { id: number; promise: Promise<T> } {
    const id = nextId++;
    const promise = new Promise<T>((resolve, reject) => {
      pending.set(id, { resolve: resolve as (v: unknown) => void, reject, onMessage });
    });
    ensure().postMessage({ ...body, id } as SolverRequest);
    return { id, promise };
  }

  function onLongJobMessage(m: SolverMessage): void {
    if (m.type === 'progress') progress.value = { phase: m.phase, fraction: m.fraction };
    else if (m.type === 'analysis') {
      analysis.value = m.analysis;
      refined.value = null;
    } else if (m.type === 'refined') refined.value = m.refined;
    else if (m.type === 'study') {
      study.value = m.study;
      governing.value = { moment: [], shear: [] };
      fatigue.value = { moment: [], shear: [] };
    } else if (m.type === 'governing-item') {
      const isStudied = m.item.vehicle === study.value?.vehicle;
      const target = isStudied ? governing : fatigue;
      const next = { moment: [...target.value.moment], shear: [...target.value.shear] };
      next[m.item.effect][m.item.girder] = m.item;
      target.value = next;
      if (isStudied && m.item.vehicle === 'fatigue truck') fatigue.value = next;
    }
  }

  async function runLong(body: RequestBody): Promise<void> {
    await cancel();
    status.value = 'working';
    error.value = null;
    progress.value = { phase: 'starting', fraction: 0 };
    const job = send<GoverningSummary[]>(body, onLongJobMessage);
    longJob = job.id;
    try {
      await job.promise;
      if (longJob === job.id) {
        status.value = 'ready';
        progress.value = null;
      }
    } catch (e) {
      if (longJob !== job.id) return;
      const err = e instanceof SolverError ? e : new SolverError({ name: 'Error', message: e instanceof Error ? e.message : String(e) });
      if (err.kind === 'CancelledError') {
        status.value = 'cancelled';
      } else {
        error.value = err;
        status.value = 'error';
      }
      progress.value = null;
    } finally {
      if (longJob === job.id) longJob = null;
    }
  }

  /**
   * Analyses a deck: code factors, grillage, surfaces for `span`, then every governing
   * placement. The previous results stay on screen until the new ones arrive.
   */
  function run(deck: unknown, options: AnalyseOptions & { span: number; vehicle: VehicleKey }): Promise<void> {
    // The previous results stay on screen until the new ones arrive (no flicker while typing).
    const { span, vehicle, ...rest } = options;
    return runLong({ type: 'analyse', deck: JSON.parse(JSON.stringify(deck)) as unknown, options: rest, span, vehicle });
  }

  /** New influence surfaces for another span or vehicle (the model is kept). */
  function restudy(span: number, vehicle: VehicleKey): Promise<void> {
    return runLong({ type: 'study', span, vehicle });
  }

  /** Stops the long job: at its next step, or by restarting the worker if it does not answer. */
  async function cancel(): Promise<void> {
    const target = longJob;
    if (target === null || !worker) return;
    const job = pending.get(target);
    // Listen for the job's end before asking, so that an immediate answer is not missed.
    const acknowledged = new Promise<boolean>((resolve) => {
      if (!job) return resolve(true);
      const original = { resolve: job.resolve, reject: job.reject };
      job.resolve = (v) => {
        original.resolve(v);
        resolve(true);
      };
      job.reject = (e) => {
        original.reject(e);
        resolve(true);
      };
    });
    worker.postMessage({ id: nextId++, type: 'cancel', target } as SolverRequest);
    const stopped = await Promise.race([acknowledged, new Promise<boolean>((resolve) => setTimeout(() => resolve(false), 400))]);
    if (!stopped) {
      worker.terminate();
      worker = null;
      const failure = new SolverError({ name: 'CancelledError', message: 'the computation was cancelled' });
      for (const p of pending.values()) p.reject(failure);
      pending.clear();
      analysis.value = null;
      study.value = null;
      live.value = null;
    }
    if (longJob === target) longJob = null;
    status.value = 'cancelled';
    progress.value = null;
  }

  // ---- the drag path ---------------------------------------------------------------------
  let evaluating = false;
  let queued: { lanes: LanePlacement[]; effect: StudyEffect } | null = null;

  function evaluate(lanes: LanePlacement[], effect: StudyEffect): void {
    if (!study.value) return;
    queued = { lanes: lanes.map((l) => ({ ...l })), effect };
    if (!evaluating) void pump();
  }

  async function pump(): Promise<void> {
    evaluating = true;
    while (queued) {
      const next = queued;
      queued = null;
      try {
        const result = await send<LiveShares>({ type: 'evaluate', lanes: next.lanes, effect: next.effect }).promise;
        live.value = result;
        const times = [...evaluateTimes.value, result.elapsedMs];
        evaluateTimes.value = times.length > 200 ? times.slice(-200) : times;
      } catch (e) {
        // A placement the solver refuses (or a session being rebuilt) leaves the last shares shown.
        if (!(e instanceof SolverError)) throw e;
      }
    }
    evaluating = false;
  }

  function governingFor(girder: number, effect: StudyEffect): Promise<GoverningSummary> {
    const known = governing.value[effect][girder];
    if (known) return Promise.resolve(known);
    return send<GoverningSummary>({ type: 'governing', girder, effect }).promise;
  }

  function surfaceGrid(girder: number, effect: StudyEffect, nx: number, ny: number): Promise<SurfaceGrid> {
    return send<SurfaceGrid>({ type: 'surface-grid', girder, effect, nx, ny }).promise;
  }

  /** The girder's envelopes: with the code's factors, and with the refined run's once it is computed (the worker reads its own result). */
  function envelopes(girder: number): Promise<GirderEnvelopeSeries[]> {
    return send<GirderEnvelopeSeries[]>({ type: 'envelopes', girder }).promise;
  }

  function codeFactors(deck: unknown): Promise<FactorRow[]> {
    return send<FactorRow[]>({ type: 'code-factors', deck: JSON.parse(JSON.stringify(deck)) as unknown }).promise;
  }

  /** Forgets every result (a deck that cannot be computed yet has none): cancels a running job too. */
  async function clear(): Promise<void> {
    await cancel();
    status.value = 'idle';
    progress.value = null;
    error.value = null;
    analysis.value = null;
    study.value = null;
    governing.value = { moment: [], shear: [] };
    fatigue.value = { moment: [], shear: [] };
    live.value = null;
    refined.value = null;
  }

  function dispose(): void {
    worker?.terminate();
    worker = null;
    for (const p of pending.values()) p.reject(new SolverError({ name: 'CancelledError', message: 'the workspace was closed' }));
    pending.clear();
  }
  onBeforeUnmount(dispose);

  return {
    status,
    progress,
    error,
    analysis,
    study,
    governing,
    fatigue,
    refined,
    live,
    evaluateTimes,
    run,
    restudy,
    cancel,
    clear,
    evaluate,
    governingFor,
    surfaceGrid,
    envelopes,
    codeFactors,
    dispose,
  };
}

export type SolverWorker = ReturnType<typeof useSolverWorker>;
