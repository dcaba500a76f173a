/**
 * `analyze sensitivity` (our own request): the normalised sensitivity S = (∂F/F)/(∂x/x) of each
 * figure F — adm, acm (signed real at 0 Hz, else magnitude), cmrr_db with ports, and every
 * measure — to each knob x: every part's value (resistors, capacitors, inductors, source DC
 * values, controlled-source gains), each device's own parameters (bipolar beta, is, va; MOS vth,
 * ucox, lambda, w, l; diode is) and, for a model shared by several devices, the model's
 * parameter moved for all of them at once. So the table can say "q3's va limits CMRR".
 *
 * By central differences with re-solves: x·(1 ± h), h = 1e-4, S = (F₊ − F₋)/(2h·F). The
 * operating point is solved to a relative tolerance of 1e-9, so the truncation (O(h²) ≈ 1e-8)
 * and rounding (≈ 1e-9/h = 1e-5 relative) errors stay far below what a ranking needs. A knob at
 * 0 or a figure at 0 has no normalised sensitivity and is left out.
 */
import type { Steps } from './steps';
import type { Requests } from '../circuit/analyses';
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { SensitivityResult } from '../circuit/result';
import type { Circuit, Part } from '../circuit/types';
import { figuresOf, perRunRequests } from './mismatch';
import { solveCircuit } from './solve-circuit';

/** The relative step of the central differences. */
export const SENSITIVITY_STEP = 1e-4;
/** At most this many re-solves (two per knob). */
export const MAX_SENSITIVITY_SOLVES = 4000;

/** One parameter that can be moved: what it is called, its value, and the circuit with it scaled. */
interface Knob {
  target: string;
  param: string;
  value: number;
  scaled(factor: number): Circuit;
}

type Scalable = Record<string, unknown>;

/** Scales one numeric field of one part (or of its model). */
function partKnob(circuit: Circuit, index: number, param: string, inModel: boolean): Knob | undefined {
  const part = circuit.parts[index] as unknown as Scalable & { name: string; model?: Scalable };
  const holder = inModel ? part.model : part;
  const value = holder?.[param];
  if (typeof value !== 'number' || !Number.isFinite(value) || value === 0) return undefined;
  return {
    target: part.name,
    param,
    value,
    scaled: (factor) => {
      const parts = [...circuit.parts];
      parts[index] = (inModel ? { ...part, model: { ...part.model, [param]: value * factor } } : { ...part, [param]: value * factor }) as unknown as Part;
      return { ...circuit, parts };
    },
  };
}

/** Every knob of the circuit, in part order, then the shared models. */
export function knobsOf(circuit: Circuit): Knob[] {
  const knobs: Knob[] = [];
  const add = (k: Knob | undefined) => k && knobs.push(k);
  const users = new Map<string, number[]>();
  circuit.parts.forEach((p, i) => {
    switch (p.kind) {
      case 'res': case 'cap': case 'ind': add(partKnob(circuit, i, 'value', false)); break;
      case 'vsrc': case 'isrc': add(partKnob(circuit, i, 'dc', false)); break;
      case 'vcvs': add(partKnob(circuit, i, 'gain', false)); break;
      case 'vccs': add(partKnob(circuit, i, 'gm', false)); break;
      case 'npn': case 'pnp': for (const k of ['beta', 'is', 'va']) add(partKnob(circuit, i, k, true)); break;
      case 'nmos': case 'pmos':
        for (const k of ['vth', 'ucox', 'lambda']) add(partKnob(circuit, i, k, true));
        for (const k of ['w', 'l']) add(partKnob(circuit, i, k, false));
        break;
      case 'diode': add(partKnob(circuit, i, 'is', true)); break;
    }
    if ('model' in p) users.set(p.model.name, [...(users.get(p.model.name) ?? []), i]);
  });
  for (const [model, indices] of users) {
    if (indices.length < 2) continue;
    const first = circuit.parts[indices[0]] as unknown as { model: Scalable };
    for (const param of Object.keys(first.model)) {
      const value = first.model[param];
      if (typeof value !== 'number' || !Number.isFinite(value) || value === 0 || param === 'name') continue;
      knobs.push({
        target: `model ${model}`,
        param,
        value,
        scaled: (factor) => ({
          ...circuit,
          parts: circuit.parts.map((p, i) => (indices.includes(i) ? ({ ...p, model: { ...(p as unknown as { model: Scalable }).model, [param]: value * factor } } as unknown as Part) : p)),
        }),
      });
    }
  }
  return knobs;
}


/** The analysis over a circuit that solved — its member, or an error when there are too many knobs — yielding after each knob's two re-solves (run/steps.ts). */
export function* sensitivitySteps(circuit: Circuit, requests: Requests): Steps<{ member?: SensitivityResult; diagnostics: Diagnostic[] }> {
  const request = requests.analyses.find((a) => a.kind === 'sensitivity');
  if (!request) return { diagnostics: [] };
  const knobs = knobsOf(circuit);
  if (2 * knobs.length > MAX_SENSITIVITY_SOLVES) {
    return { diagnostics: [diagnostic('error', 'sweep-too-large', request.loc, `analyze sensitivity would re-solve the circuit ${2 * knobs.length} times, more than ${MAX_SENSITIVITY_SOLVES}.`, 'split the circuit, or ask for it on a smaller one')] };
  }
  const perRun = perRunRequests(requests);
  const figures = (c: Circuit) => {
    const run = solveCircuit(c, perRun);
    return run.result.op ? figuresOf(run.result, requests) : undefined;
  };
  const nominal = figures(circuit);
  if (!nominal) return { diagnostics: [] };
  const rows: Record<string, { target: string; param: string; s: number }[]> = {};
  for (const name of Object.keys(nominal)) rows[name] = [];
  let unsolved = 0;
  for (const knob of knobs) {
    const up = figures(knob.scaled(1 + SENSITIVITY_STEP));
    const down = figures(knob.scaled(1 - SENSITIVITY_STEP));
    yield;
    if (!up || !down) {
      unsolved++;
      continue;
    }
    for (const [name, f0] of Object.entries(nominal)) {
      if (f0 === 0 || !(name in up) || !(name in down)) continue;
      const s = (up[name] - down[name]) / (2 * SENSITIVITY_STEP * f0);
      if (Number.isFinite(s)) rows[name].push({ target: knob.target, param: knob.param, s });
    }
  }
  for (const list of Object.values(rows)) list.sort((a, b) => Math.abs(b.s) - Math.abs(a.s));
  const diagnostics = unsolved ? [diagnostic('warning', 'sweep-value-failed', request.loc, `analyze sensitivity: ${unsolved} of ${knobs.length} parameters could not be moved by ±${SENSITIVITY_STEP * 100} % without the circuit failing to solve; they are left out.`)] : [];
  return { member: { step: SENSITIVITY_STEP, figures: rows }, diagnostics };
}
