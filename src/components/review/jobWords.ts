/**
 * What a server job (a refined run) is doing, in words, for every place that follows one: the
 * review's summary card and the report downloads.
 */
import type { ComputeJob } from '@/api/reviews';
import type { SessionUser } from '@/api/types';

const seconds = (from: string | null, nowMs: number) => (from ? Math.max(0, Math.round((nowMs - Date.parse(from)) / 1000)) : 0);

/** The worker's own step, or '' when it has said nothing yet. */
export function jobStep(job: Pick<ComputeJob, 'progress'>): string {
  const p = job.progress;
  if (!p) return '';
  if (p.phase === 'model') return 'building the grillage and its influence surfaces.';
  if (p.phase === 'search') return `finding the governing truck positions, ${p.done.toLocaleString('en-US')} of ${p.total.toLocaleString('en-US')} factors done.`;
  if (p.phase === 'refine') return `sampling denser where a bound was loose, ${p.done.toLocaleString('en-US')} of ${p.total.toLocaleString('en-US')} factors searched again.`;
  return 'checking the moment factors again at twice the mesh density.';
}

/** "Waiting for a free analysis worker (5 s so far)." / "Running on the server for 3 s: …" / '' once it has ended. */
export function jobLine(job: Pick<ComputeJob, 'state' | 'createdAt' | 'startedAt' | 'progress'>, nowMs: number): string {
  if (job.state === 'queued') return `Waiting for a free analysis worker (${seconds(job.createdAt, nowMs)} s so far).`;
  if (job.state === 'running') {
    const step = jobStep(job);
    return `Running on the server for ${seconds(job.startedAt, nowMs)} s${step ? `: ${step}` : '.'}`;
  }
  return '';
}

/** Whether `me` may cancel the job (the server's rule: the user who asked for it, or an administrator). */
export function mayCancel(job: Pick<ComputeJob, 'state' | 'kind' | 'requestedBy'>, me: Pick<SessionUser, 'id' | 'roles'> | null): boolean {
  if (!me || job.kind !== 'refined' || (job.state !== 'queued' && job.state !== 'running')) return false;
  return job.requestedBy?.id === me.id || me.roles.includes('admin');
}
