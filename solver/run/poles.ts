/**
 * `analyze poles [out NODE]`: the §5 `poles` member — the poles of the circuit linearised at its
 * operating point with every independent source zeroed, and the zeros of the ports' adm (or,
 * without ports, of the transfer from the first source with an `ac=` to NODE) — as complex
 * frequencies s/2π in Hz, and the lists the measures pole(k) and zero(k) read. The method is in
 * analysis/pencil-eigenvalues.ts and analysis/poles-zeros.ts.
 */
import { diagnostic, type Diagnostic, type SourceLoc } from '../circuit/diagnostic';
import type { PoleZero, PolesResult } from '../circuit/result';
import type { Circuit } from '../circuit/types';
import { circuitPoles, MAX_POLES_UNKNOWNS, nodeTransfer, portsTransfer, transferZeros, type TransferVectors } from '../analysis/poles-zeros';
import type { Phasor } from '../numeric/complex';
import type { AnalysisRunner, BiasPoint } from './analysis-run';

/** Largest |q| reported: stands for a lossless pair (Re s = 0), as CMRR_CAP does for an unbounded CMRR. */
export const Q_CAP = 1e15;

/** The definitions, in words (printed with the table). */
export function polesConventions(zerosOf: string | undefined): string {
  return (
    'Poles: the natural frequencies of the circuit linearised at its operating point with every independent source zeroed ' +
    '(voltage sources shorted, current sources open). ' +
    (zerosOf ? `Zeros: those of ${zerosOf}; a zero equal to a pole (a mode the transfer does not see) cancels it. ` : '') +
    'Complex frequencies s/2π in Hz, sorted by |s|, a conjugate pair with im > 0 first; q = |s|/(−2·Re s) of a complex pair ' +
    '(negative in the right half-plane). Infinite ones (beyond 10¹² times the slowest time scale) are left out, and so are zeros beyond 10⁴ times the fastest pole.'
  );
}

/** Sorted by |s|, a conjugate pair with im > 0 first, in Hz with the q of each complex one. */
export function toFigures(values: readonly Phasor[]): PoleZero[] {
  const sorted = [...values].sort((a, b) => Math.hypot(a.re, a.im) - Math.hypot(b.re, b.im) || b.im - a.im || a.re - b.re);
  return sorted.map((s) => {
    const figure: PoleZero = { re: s.re / (2 * Math.PI), im: s.im / (2 * Math.PI) };
    if (s.im !== 0) {
      const size = Math.hypot(s.re, s.im);
      const q = Math.abs(s.re) * Q_CAP <= size / 2 ? (s.re > 0 ? -Q_CAP : Q_CAP) : size / (-2 * s.re);
      figure.q = q;
    }
    return figure;
  });
}

/** The first source (in the netlist's order) with a non-zero `ac=`. */
function firstAcSource(circuit: Circuit): string | undefined {
  for (const p of circuit.parts) if ((p.kind === 'vsrc' || p.kind === 'isrc') && p.ac && p.ac.mag !== 0) return p.name;
  return undefined;
}

/** Which transfer's zeros the request asks for, with its name; diagnostics when it names one that cannot be. */
function chooseTransfer(circuit: Circuit, bias: BiasPoint, out: string | undefined, loc: SourceLoc, diagnostics: Diagnostic[]): { vectors: TransferVectors; label: string } | undefined {
  const ports = bias.ports?.request;
  if (ports) {
    if (out !== undefined) {
      diagnostics.push(diagnostic('warning', 'poles-out-ignored', loc, `analyze poles: the zeros are those of adm, as a \`ports\` line is given; \`out ${out}\` is ignored.`, 'write `analyze poles` alone, or remove the ports line to get the zeros of the transfer to the node'));
    }
    return { vectors: portsTransfer(bias.system, ports), label: 'adm' };
  }
  if (out === undefined) return undefined;
  const source = firstAcSource(circuit);
  if (!source) {
    diagnostics.push(diagnostic('warning', 'no-ac-source', loc, `analyze poles out ${out}: no source has an \`ac=\` value, so there is no transfer whose zeros to find; the poles are given alone.`, 'give the input source an excitation, e.g. `vin: vsrc(in, gnd) 0 ac=1`'));
    return undefined;
  }
  return { vectors: nodeTransfer(bias.system, source, out), label: `v(${out})/${source}` };
}

/** Runs a resolved poles request (its `out` node was checked where the line was read). */
export const runPoles: AnalysisRunner<'poles', PolesResult> = (circuit, bias, request) => {
  const diagnostics: Diagnostic[] = [];
  const size = bias.system.size;
  if (size > MAX_POLES_UNKNOWNS) {
    diagnostics.push(diagnostic('error', 'poles-too-large', request.loc,
      `analyze poles: the circuit has ${size} unknowns; the poles analysis takes at most ${MAX_POLES_UNKNOWNS} (its dense eigenvalue work grows as the cube of the size).`,
      'find the poles of a smaller part of the circuit'));
    return { diagnostics };
  }
  const poles = circuitPoles(bias.system);
  if (!poles.ok) {
    diagnostics.push(diagnostic('error', 'poles-singular', request.loc,
      'analyze poles: the small-signal circuit is singular at 0 Hz (it has no unique DC solution), so its poles are undefined.',
      'look for a part of the circuit with no DC path to ground, or a loop of voltage sources'));
    return { diagnostics };
  }
  const transfer = chooseTransfer(circuit, bias, request.out, request.loc, diagnostics);
  let zeros: Phasor[] = [];
  if (transfer) {
    const found = transferZeros(bias.system, transfer.vectors, poles.poles);
    if (found.ok) zeros = found.zeros;
    else {
      diagnostics.push(diagnostic('warning', 'poles-no-transfer', request.loc,
        `analyze poles: ${transfer.label} is zero at every frequency, so it has no zeros to report.`,
        'check that the output connects to the stage the input drives'));
    }
  }
  const member: PolesResult = {
    poles_hz: toFigures(poles.poles),
    zeros_hz: toFigures(zeros),
    ...(transfer ? { zeros_of: transfer.label } : {}),
    conventions: polesConventions(transfer?.label),
  };
  return { member, diagnostics, measures: { poles: { poles: member.poles_hz, zeros: member.zeros_hz } } };
};
