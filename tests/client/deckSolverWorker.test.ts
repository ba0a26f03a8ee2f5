// @vitest-environment happy-dom
/**
 * The workspace's link to the solver worker, with a scripted stand-in for the worker: a fast
 * drag never builds a queue of evaluations (only the newest placement waits), results of a
 * long job arrive piece by piece, and cancel stops the job at its next step or, when the
 * worker does not answer, ends it and starts a fresh one. (Behaviour of the client, no source.)
 */
import { afterEach, describe, expect, it } from 'vitest';
import { defineComponent, h } from 'vue';
import { mount, type VueWrapper } from '@vue/test-utils';
import { useSolverWorker, type SolverWorker } from '@/composables/useSolverWorker';
import type { SolverMessage, SolverRequest } from '@/workers/solverProtocol';

class ScriptedWorker {
  received: SolverRequest[] = [];
  terminated = false;
  onmessage: ((e: MessageEvent<SolverMessage>) => void) | null = null;
  onerror: ((e: ErrorEvent) => void) | null = null;
  /** Answer cancel requests (a worker between steps) or ignore them (a worker busy in one step). */
  constructor(public answersCancel: boolean) {}
  postMessage(req: SolverRequest): void {
    this.received.push(req);
    if (req.type === 'cancel' && this.answersCancel) {
      this.reply({ id: req.target, type: 'error', error: { name: 'CancelledError', message: 'the computation was cancelled' } });
    }
  }
  terminate(): void {
    this.terminated = true;
  }
  reply(message: SolverMessage): void {
    this.onmessage?.({ data: message } as MessageEvent<SolverMessage>);
  }
}

let wrapper: VueWrapper | null = null;
function setup(answersCancel = true): { solver: SolverWorker; workers: ScriptedWorker[] } {
  const workers: ScriptedWorker[] = [];
  let solver!: SolverWorker;
  wrapper = mount(
    defineComponent({
      setup() {
        solver = useSolverWorker(() => {
          const w = new ScriptedWorker(answersCancel);
          workers.push(w);
          return w as unknown as Worker;
        });
        return () => h('div');
      },
    }),
  );
  return { solver, workers };
}

afterEach(() => {
  wrapper?.unmount();
  wrapper = null;
});

const tick = () => new Promise((r) => setTimeout(r, 0));
const study = { span: 0, vehicle: 'design truck', momentFraction: 0.5, momentX: 10, shearSupport: 0, beamLineMax: { moment: 1, shear: 1 }, beamLinePosition: { moment: { frontAxleAt: 5, direction: 1 }, shear: { frontAxleAt: 5, direction: 1 } }, sampleRelativeError: { moment: 0, shear: 0 }, elapsedMs: 1 };

describe('useSolverWorker', () => {
  it('takes the results of a long job as they arrive, then reports it ready', async () => {
    const { solver, workers } = setup();
    const done = solver.run({ name: 'deck' }, { span: 0, vehicle: 'design truck' });
    await tick();
    const job = workers[0].received.find((r) => r.type === 'analyse')!;
    expect(solver.status.value).toBe('working');
    workers[0].reply({ id: job.id, type: 'progress', phase: 'influence surfaces', fraction: 0.4 });
    expect(solver.progress.value).toEqual({ phase: 'influence surfaces', fraction: 0.4 });
    workers[0].reply({ id: job.id, type: 'study', study: study as never });
    workers[0].reply({ id: job.id, type: 'governing-item', item: { girder: 2, effect: 'shear', vehicle: 'design truck', factor: 0.8 } as never });
    workers[0].reply({ id: job.id, type: 'governing-item', item: { girder: 2, effect: 'shear', vehicle: 'fatigue truck', factor: 0.5 } as never });
    expect(solver.governing.value.shear[2]?.factor).toBe(0.8);
    expect(solver.fatigue.value.shear[2]?.factor).toBe(0.5);
    workers[0].reply({ id: job.id, type: 'done', result: [] });
    await done;
    expect(solver.status.value).toBe('ready');
    expect(solver.progress.value).toBeNull();
  });

  it('sends at most one evaluation at a time and only the newest placement after it', async () => {
    const { solver, workers } = setup();
    void solver.run({}, { span: 0, vehicle: 'design truck' });
    await tick();
    const job = workers[0].received[0];
    workers[0].reply({ id: job.id, type: 'study', study: study as never });
    for (let i = 0; i < 5; i++) solver.evaluate([{ left: i, wheelOffset: 0.6 }], 'moment');
    await tick();
    let evaluations = workers[0].received.filter((r) => r.type === 'evaluate');
    expect(evaluations).toHaveLength(1);
    workers[0].reply({ id: evaluations[0].id, type: 'done', result: { effect: 'moment', shares: [0.5, 0.2], loadedLanes: 1, multiplePresence: 1.2, lanes: [], elapsedMs: 0.05 } });
    await tick();
    await tick();
    evaluations = workers[0].received.filter((r) => r.type === 'evaluate');
    expect(evaluations).toHaveLength(2);
    expect((evaluations[1] as Extract<SolverRequest, { type: 'evaluate' }>).lanes[0].left).toBe(4);
    expect(solver.live.value?.shares).toEqual([0.5, 0.2]);
    expect(solver.evaluateTimes.value).toEqual([0.05]);
  });

  it('cancels a long job at its next step', async () => {
    const { solver, workers } = setup(true);
    const done = solver.run({}, { span: 0, vehicle: 'design truck' });
    await tick();
    await solver.cancel();
    await done;
    expect(workers[0].received.some((r) => r.type === 'cancel')).toBe(true);
    expect(workers[0].terminated).toBe(false);
    expect(solver.status.value).toBe('cancelled');
  });

  it('ends a worker that does not answer a cancel and starts a fresh one', async () => {
    const { solver, workers } = setup(false);
    void solver.run({}, { span: 0, vehicle: 'design truck' });
    await tick();
    await solver.cancel();
    expect(workers[0].terminated).toBe(true);
    expect(solver.status.value).toBe('cancelled');
    void solver.codeFactors({}).catch(() => undefined);
    expect(workers).toHaveLength(2);
    expect(workers[1].received[0].type).toBe('code-factors');
  });

  it('shows the solver’s error with the fields it names', async () => {
    const { solver, workers } = setup();
    const done = solver.run({}, { span: 0, vehicle: 'design truck' });
    await tick();
    workers[0].reply({ id: workers[0].received[0].id, type: 'error', error: { name: 'DeckInputError', message: 'slab.thickness: slab thickness must be greater than 0', issues: [{ path: ['slab', 'thickness'], message: 'slab thickness must be greater than 0' }] } });
    await done;
    expect(solver.status.value).toBe('error');
    expect(solver.error.value?.issues[0].path).toEqual(['slab', 'thickness']);
  });
});
