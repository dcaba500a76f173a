import { describe, expect, it } from 'vitest';
import { solveNetlist } from '../solve';
import { measureFunctions } from '../measure/functions';
import { measureMath } from '../measure/math';
import { parseNetlist } from '../elaborate/parse-netlist';
import { PART_KINDS } from './part-kinds';
import {
  ANALYSES, ANALYSIS_SPECS, BUILTIN_FIGURES, DEVICE_FIELDS, FUNCTIONS, KEYWORDS, MEASURABLE, MEASURE_FUNCTIONS, RESULT_FUNCTIONS, STATEMENTS, takesNames,
} from './vocabulary';

// A netlist with one device of every family, so every field of the operating point shows up.
const ALL_DEVICES = `title every device
model qn: npn(is=1e-16, beta=100, va=80, cje=1p, cjc=0.5p)
model mn: nmos(ucox=200u, vth=0.5, lambda=0.05, cgs=10f, cgd=2f)
vcc: vsrc(vcc, gnd) 5
rb: res(vcc, b) 430k
rc: res(vcc, c) 2k
q1: npn(c=c, b=b, e=gnd) qn
rd: res(vcc, d) 5k
vg: vsrc(g, gnd) 1
m1: nmos(d=d, g=g, s=gnd) mn w=2u l=1u
rdi: res(vcc, an) 10k
d1: diode(a=an, k=gnd)
`;

describe('the vocabulary', () => {
  it('names every statement, analysis and function once', () => {
    for (const list of [KEYWORDS, ANALYSES, FUNCTIONS.map((f) => f.name), BUILTIN_FIGURES]) expect(new Set(list).size).toBe(list.length);
    expect(KEYWORDS).toEqual(['title', 'param', 'option', 'model', 'block', 'end', 'use', 'analyze', 'ports', 'measure', 'check']);
    expect(ANALYSIS_SPECS.every((a) => a.syntax.startsWith(`analyze ${a.kind}`) && a.doc && a.detail)).toBe(true);
    expect(STATEMENTS.every((s) => s.syntax.startsWith(s.keyword) && s.doc)).toBe(true);
  });

  it('gives every function an argument kind, a doc and the name slots that match it', () => {
    for (const f of FUNCTIONS) {
      expect(f.doc.length, f.name).toBeGreaterThan(3);
      expect(f.names > 0, f.name).toBe(takesNames(f));
    }
    expect([...MEASURE_FUNCTIONS]).toEqual(expect.arrayContaining(['log', 'exp', 'pow', 'log10', 'sqrt', 'abs', 'min', 'max']));
    expect(RESULT_FUNCTIONS.has('v') && RESULT_FUNCTIONS.has('zin') && !RESULT_FUNCTIONS.has('db')).toBe(true);
  });

  it('every function of the table is implemented by the measure evaluator', () => {
    const op = { nodes: {}, sources: {}, parts: {}, devices: {} };
    const table = measureFunctions({ op, params: {} });
    // Plain math (min, log, pow…) comes from the measures' mathjs instance; the rest from the table.
    for (const f of FUNCTIONS) {
      const implementation = table[f.name] ?? (f.arg === 'value' ? measureMath[f.name as keyof typeof measureMath] : undefined);
      expect(typeof implementation, f.name).toBe('function');
    }
  });

  it('the parser accepts every function of the table in a measure', () => {
    const text = `${ALL_DEVICES}measure a = log(exp(pow(2, 3))) + log10(100) + sqrt(4) + abs(-1) + min(1, 2) + max(1, 2)\n`;
    const parsed = parseNetlist(text);
    expect(parsed.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const result = solveNetlist(text);
    // ln(e^8) + 2 + 2 + 1 + 1 + 2 = 16 (arithmetic).
    expect(result.measures.a).toBeCloseTo(16, 12);
  });

  it('every field of a solved device has a unit and a doc; every measurable quantity is a field', () => {
    const result = solveNetlist(ALL_DEVICES);
    expect(result.errors).toEqual([]);
    const devices = Object.values(result.op!.devices);
    expect(devices.map((d) => d.kind).sort()).toEqual(['diode', 'nmos', 'npn']);
    for (const d of devices) {
      for (const [key, value] of Object.entries(d)) {
        if (typeof value !== 'number') continue;
        expect(DEVICE_FIELDS[key], `${d.kind}.${key}`).toBeDefined();
      }
    }
    for (const q of [...MEASURABLE.bjt, ...MEASURABLE.mos]) expect(DEVICE_FIELDS[q]).toBeDefined();
  });

  it('documents every part kind', () => {
    for (const spec of Object.values(PART_KINDS)) expect(spec.doc.length, spec.kind).toBeGreaterThan(3);
  });
});
