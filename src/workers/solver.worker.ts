/**
 * The solver Web Worker: runs the shared solver off the interface thread. Long work (the
 * grillage model, the influence surfaces, the governing placements) reports progress and
 * yields between its steps, so evaluations of a dragged placement are answered in between
 * and a cancel takes effect at the next step.
 */
import { DeckInputError } from '../../shared/deck/schema';
import { CancelledError, SolverSession, type WorkContext } from './solverCore';
import type { SolverErrorInfo, SolverMessage, SolverRequest } from './solverProtocol';

const session = new SolverSession();
/** The long job that owns the session's state; an older one stops at its next step. */
let owner = 0;
const cancelled = new Set<number>();

const post = (message: SolverMessage, transfer: Transferable[] = []) =>
  (self as unknown as { postMessage(m: SolverMessage, t: Transferable[]): void }).postMessage(message, transfer);

function context(id: number): WorkContext {
  return {
    progress: (phase, fraction) => post({ id, type: 'progress', phase, fraction }),
    checkpoint: () =>
      new Promise<void>((resolve, reject) => {
        setTimeout(() => {
          if (cancelled.has(id) || owner !== id) reject(new CancelledError());
          else resolve();
        }, 0);
      }),
  };
}

function errorInfo(error: unknown): SolverErrorInfo {
  if (error instanceof DeckInputError) return { name: error.name, message: error.message, issues: error.issues.map((i) => ({ path: i.path, message: i.message })) };
  if (error instanceof Error) return { name: error.name, message: error.message };
  return { name: 'Error', message: String(error) };
}

async function handle(req: SolverRequest): Promise<void> {
  const { id } = req;
  switch (req.type) {
    case 'cancel':
      cancelled.add(req.target);
      return;
    case 'analyse': {
      owner = id;
      const ctx = context(id);
      const analysis = await session.analyse(req.deck, req.options, ctx);
      post({ id, type: 'analysis', analysis });
      if (!analysis.grillage) {
        post({ id, type: 'done', result: [] });
        return;
      }
      await ctx.checkpoint();
      const study = await session.study(req.span, req.vehicle, ctx);
      post({ id, type: 'study', study });
      await ctx.checkpoint();
      const all = await session.governingAll(ctx, (item) => post({ id, type: 'governing-item', item }));
      ctx.progress('refined factors of every girder, effect and span', 0.95);
      await ctx.checkpoint();
      post({ id, type: 'refined', refined: session.refinedComparison() });
      post({ id, type: 'done', result: all });
      return;
    }
    case 'study': {
      owner = id;
      const ctx = context(id);
      const study = await session.study(req.span, req.vehicle, ctx);
      post({ id, type: 'study', study });
      await ctx.checkpoint();
      const all = await session.governingAll(ctx, (item) => post({ id, type: 'governing-item', item }));
      await ctx.checkpoint();
      post({ id, type: 'refined', refined: session.refinedComparison() });
      post({ id, type: 'done', result: all });
      return;
    }
    case 'evaluate':
      post({ id, type: 'done', result: session.evaluate(req.lanes, req.effect) });
      return;
    case 'governing':
      post({ id, type: 'done', result: session.governing(req.girder, req.effect, req.vehicle) });
      return;
    case 'surface-grid': {
      const grid = session.surfaceGrid(req.girder, req.effect, req.nx, req.ny);
      post({ id, type: 'done', result: grid }, [grid.values.buffer, grid.xs.buffer, grid.ys.buffer]);
      return;
    }
    case 'envelopes':
      post({ id, type: 'done', result: session.envelopes(req.girder) });
      return;
    case 'code-factors':
      post({ id, type: 'done', result: SolverSession.codeFactorRows(req.deck) });
      return;
  }
}

self.onmessage = (event: MessageEvent<SolverRequest>) => {
  const req = event.data;
  handle(req)
    .catch((error: unknown) => post({ id: req.id, type: 'error', error: errorInfo(error) }))
    .finally(() => {
      if (req.type !== 'cancel') cancelled.delete(req.id);
    });
};
