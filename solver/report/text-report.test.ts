import { describe, expect, it } from 'vitest';
import type { SolveResult } from '../circuit/result';
import { CAUTION, formatReport } from './text-report';

const base: SolveResult = {
  title: 'Report test',
  temp_c: 27,
  op: {
    nodes: { outa: 7.6, tail: -0.72 },
    sources: { vcc: { v: 10, i: -0.004 } },
    parts: { rc1: { i: 0.002, v: 2.4 } },
    devices: {
      q1: { kind: 'npn', region: 'active', ic: 0.002, ib: 2e-5, ie: 0.00202, vbe: 0.72, vce: 8.3, gm: 0.0773, rpi: 1293, ro: 1e30, cpi: 1e-12, cmu: 5e-13, rb: 0 },
    },
  },
  ports: {
    at_hz: 0, output: 'differential',
    adm: { re: -92.8, im: 0, mag: 92.8, db: 39.35, phase_deg: 180 },
    acm: { re: -0.06, im: 0, mag: 0.06, db: -24.4, phase_deg: 180 },
    cmrr: 1546, cmrr_db: 63.8, conventions: 'adm = vod/vid',
  },
  measures: { a0: 39.35, f3: 1.2e7 },
  checks: [{ text: 'cmrr_db >= 80', pass: false, value: 63.8, limit: 80, margin: -16.2, line: 31 }],
  warnings: [{ severity: 'warning', code: 'saturated', line: 12, col: 1, message: 'q3 is saturated.', hint: 'raise its collector' }],
  errors: [],
};

describe('text report', () => {
  it('shows the title, the caution, SI-prefixed tables, ports, measures and checks', () => {
    const text = formatReport(base);
    expect(text.startsWith('Report test\n')).toBe(true);
    expect(text.replace(/\s+/g, ' ')).toContain(CAUTION);
    expect(text).toMatch(/outa\s+7\.600 V/);
    expect(text).toMatch(/vcc\s+10\.00 V\s+-4\.000 mA/);
    expect(text).toMatch(/q1\s+npn\s+active\s+2\.000 mA\s+20\.00 µA/);
    expect(text).toContain('∞ Ω');
    expect(text).toMatch(/adm\s+-92\.8\s+39\.35 dB\s+180\.0°/);
    expect(text).toMatch(/f3\s+12\.00 M/);
    expect(text).toMatch(/FAIL\s+cmrr_db >= 80\s+63\.8\s+80\s+-16\.2\s+31/);
    expect(text).toContain('12:1  q3 is saturated.  (hint: raise its collector)');
    expect(text).toContain('Solved.');
  });

  it('lists errors with line:col and hint, and no "Solved."', () => {
    const text = formatReport({ ...base, op: undefined, ports: undefined, measures: {}, checks: [], errors: [{ severity: 'error', code: 'meg-prefix', line: 4, col: 17, message: '`meg` is not a prefix.', hint: 'write M for mega' }] });
    expect(text).toContain('Errors (1)');
    expect(text).toContain('4:17  `meg` is not a prefix.  (hint: write M for mega)');
    expect(text).not.toContain('Solved.');
  });
});
