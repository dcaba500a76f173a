import { describe, expect, it } from 'vitest';
import { ANALYSIS_SPECS } from '../language/vocabulary';
import { solveNetlist } from '../solve';
import { ANALYSIS_RUNNERS, RUNNING_KINDS } from './analyses';
import { SWEEP_KINDS } from './sweeps';

// A divider driven by one source with an ac value: every analysis has something to work on.
const DIVIDER = ['param r = 1k', 'va: vsrc(a, gnd) 1 ac=1', 'r1: res(a, out) r', 'r2: res(out, gnd) 1k', 'c1: cap(out, gnd) 1n'].join('\n');

describe('analyses by kind', () => {
  it('every runner is an analysis of the language', () => {
    const kinds = ANALYSIS_SPECS.map((a) => a.kind);
    for (const kind of RUNNING_KINDS) expect(kinds).toContain(kind);
    expect(typeof ANALYSIS_RUNNERS.ac).toBe('function');
  });

  it('each analysis of the language either fills its own member or is reported as not yet available', () => {
    for (const spec of ANALYSIS_SPECS) {
      const line = spec.kind === 'transfer' ? 'analyze transfer va from 0 to 1 step 0.5' : spec.kind === 'noise' ? 'analyze noise out out in va from 10 Hz to 1 kHz per decade 1' : spec.kind === 'vary' ? 'analyze vary r over 1k 2k' : spec.syntax;
      const result = solveNetlist(`${DIVIDER}\n${line}`);
      expect(result.errors, spec.kind).toEqual([]);
      const running = (RUNNING_KINDS as string[]).includes(spec.kind) || (SWEEP_KINDS as readonly string[]).includes(spec.kind) || spec.kind === 'mismatch' || spec.kind === 'sensitivity';
      expect(spec.kind in result, spec.kind).toBe(running);
      expect(result.warnings.map((w) => w.code), spec.kind).toEqual(running ? [] : ['analysis-not-available']);
    }
  });

  it('the ac member holds the ac(n) curves over the requested grid (10 Hz to 1 kHz, 2 per decade: 5 points)', () => {
    const result = solveNetlist(`${DIVIDER}\nanalyze ac from 10 Hz to 1 kHz per decade 2`);
    expect(result.ac?.freq_hz).toHaveLength(5);
    expect(Object.keys(result.ac!.curves)).toEqual(['ac(a)', 'ac(out)']);
  });
});
