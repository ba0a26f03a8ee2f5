// @vitest-environment happy-dom
/**
 * Trace steps and findings show the lengths inside their sentences in the reader's units
 * (shared/quantities/inText.ts; 1 ft = 0.3048 m exactly, NIST SP 811).
 */
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import TraceView from '@/components/factors/TraceView.vue';
import { lengthInText } from '@shared/quantities/inText';
import type { TraceStep } from '@shared/trace';

const step: TraceStep = {
  label: `Beam line: one lane, moment at ${lengthInText(16.764)} along the girder`,
  formula: 'E_1 = …',
  inputs: [],
  value: 1,
  kind: 'none',
  article: 'AASHTO LRFD Art. 3.6.1.3.1',
  note: `bay of ${lengthInText(3.048)}`,
};

describe('trace lengths', () => {
  it('in ft on a US customary project and in m on an SI one, never as a token', () => {
    const us = mount(TraceView, { props: { steps: [step], units: 'US' } });
    expect(us.text()).toContain('moment at 55.00 ft along the girder');
    expect(us.text()).toContain('bay of 10.00 ft');
    expect(us.text()).not.toContain('{{len:');
    us.unmount();
    const si = mount(TraceView, { props: { steps: [step], units: 'SI' } });
    expect(si.text()).toContain('moment at 16.764 m along the girder');
    si.unmount();
  });
});
