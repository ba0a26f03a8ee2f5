// @vitest-environment happy-dom
/** The card that stands for the refined summary while its job runs: the job's state, where the
 *  run is (the worker's progress), and a failed job's reason with a way to run it again. */
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import RefinedJobProgress from '@/components/review/RefinedJobProgress.vue';
import type { ComputeJob } from '@/api/reviews';

const job = (over: Partial<ComputeJob>): ComputeJob => ({
  id: 5,
  url: '/api/jobs/5',
  kind: 'refined',
  state: 'running',
  solverVersion: '1.1.0',
  requestedBy: null,
  createdAt: new Date(Date.now() - 5000).toISOString(),
  startedAt: new Date(Date.now() - 3000).toISOString(),
  finishedAt: null,
  runMs: null,
  error: null,
  progress: null,
  ...over,
});

describe('refined job card', () => {
  it('says how far the search is', () => {
    const w = mount(RefinedJobProgress, { props: { job: job({ progress: { phase: 'search', done: 12, total: 96 } }), error: null } });
    const line = w.get('[data-test="refined-job-line"]').text();
    expect(line).toMatch(/^Running on the server for 3 s: finding the governing truck positions, 12 of 96 factors done\./);
    expect(w.get('[data-test="refined-job"]').attributes('data-state')).toBe('running');
    w.unmount();
  });

  it('a queued job says how long it has waited', () => {
    const w = mount(RefinedJobProgress, { props: { job: job({ state: 'queued', startedAt: null }), error: null } });
    expect(w.get('[data-test="refined-job-line"]').text()).toMatch(/^Waiting for a free analysis worker \(5 s so far\)\./);
    w.unmount();
  });

  it('a failed job shows its reason and offers to run it again', async () => {
    const w = mount(RefinedJobProgress, { props: { job: job({ state: 'failed', error: 'ran longer than the limit of 60 s' }), error: null } });
    expect(w.text()).toContain('did not finish');
    expect(w.text()).toContain('ran longer than the limit of 60 s');
    await w.get('[data-test="refined-job-retry"]').trigger('click');
    expect(w.emitted('retry')).toHaveLength(1);
    w.unmount();
  });
});

describe('cancelling from the refined job card', () => {
  it('offers Cancel when allowed, and shows a cancelled job with its reason and Run it again', async () => {
    const running = mount(RefinedJobProgress, { props: { job: job({}), error: null, canCancel: true } });
    await running.get('[data-test="refined-job-cancel"]').trigger('click');
    expect(running.emitted('cancel')).toHaveLength(1);
    running.unmount();
    const other = mount(RefinedJobProgress, { props: { job: job({}), error: null, canCancel: false } });
    expect(other.find('[data-test="refined-job-cancel"]').exists()).toBe(false);
    other.unmount();
    const cancelled = mount(RefinedJobProgress, { props: { job: job({ state: 'cancelled', error: 'cancelled by Dana Okonkwo while it ran' }), error: null, canCancel: true } });
    expect(cancelled.text()).toContain('was cancelled');
    expect(cancelled.text()).toContain('cancelled by Dana Okonkwo while it ran');
    expect(cancelled.find('[data-test="refined-job-cancel"]').exists()).toBe(false);
    await cancelled.get('[data-test="refined-job-retry"]').trigger('click');
    expect(cancelled.emitted('retry')).toHaveLength(1);
    cancelled.unmount();
  });
});
