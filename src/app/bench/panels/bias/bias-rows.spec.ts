import { solveNetlist } from '../../../../../solver';
import { deviceProblems, headroomFlag } from './bias-rows';

describe('headroom flags', () => {
  // A pnp source: emitter at 10 V, base held 0.7 V-ish below by a divider, collector 1k to ground.
  // Its collector sits volts below the emitter: active with headroom (common practice: VEC > 0.3 V).
  const pnp = solveNetlist(
    [
      'vcc: vsrc(vcc, gnd) 10 V',
      'vb: vsrc(vcc, b) 0.65 V',
      'q1: pnp(c=c, b=b, e=vcc)',
      'rl: res(c, gnd) 1k',
    ].join('\n'),
  );

  it('does not flag an active pnp with volts of VEC', () => {
    const q1 = pnp.op!.devices['q1'];
    expect(q1.kind).toBe('pnp');
    expect(q1.region).toBe('active');
    expect(headroomFlag(q1)).toBeUndefined();
    expect(deviceProblems(pnp.op!)).toEqual([]);
  });

  it('flags an npn whose VCE is under 0.3 V while still active', () => {
    const r = solveNetlist(['vcc: vsrc(vcc, gnd) 0.25 V', 'vb: vsrc(b, gnd) 0.6 V', 'q1: npn(c=vcc, b=b, e=gnd)'].join('\n'));
    const q1 = r.op!.devices['q1'];
    expect(q1.region).toBe('active');
    expect(headroomFlag(q1)?.text).toBe('VCE < 0.3 V');
  });
});
