/**
 * The noise sources of a circuit linearised at its operating point (netlist language §3): each a
 * current source between two rows of the small-signal system with a one-sided power spectral
 * density in A²/Hz.
 *
 *   resistor R            4kT/R                     thermal, between its terminals
 *   bipolar base res. rb  4kT/rb                    thermal, external to internal base
 *   bipolar collector     2q·|IC|                   shot, collector to emitter
 *   bipolar base          2q·|IB|·(1 + fc/f)        shot (+ flicker), internal base to emitter
 *   diode                 2q·|ID|·(1 + fc/f)        shot (+ flicker), anode to cathode
 *   MOS channel           4kT·(2/3)·gm·(1 + fc/f)   thermal (+ flicker), drain to source
 *
 * Thermal noise 4kT/R (Nyquist, 1928); shot noise 2qI (Schottky, 1918); the MOS channel factor
 * 2/3 is the long-channel value in saturation (Razavi, Design of Analog CMOS Integrated Circuits,
 * 2nd ed., ch. 7) and is used in every region, gm being the square law's at the operating point
 * (0 in cut-off). fc is the model key `flicker_corner`: the 1/f part equals the white part at fc.
 * Bipolar flicker noise sits in the base current, as the textbooks model it (Gray et al.,
 * Analysis and Design of Analog Integrated Circuits, 5th ed., ch. 11). T is the solve's
 * temperature; k and q are the exact SI values shared with the device equations.
 */
import type { BjtOp, DiodeOp, MosOp } from '../circuit/result';
import { GROUND, type Circuit } from '../circuit/types';
import { BOLTZMANN, ELEMENTARY_CHARGE, kelvin } from '../devices/temperature';
import type { LinearSystem, OperatingPoint } from './engine-api';
import { conductanceOf, internalBaseName } from './mna';

/** MOS channel thermal-noise factor γ of 4kT·γ·gm: the long-channel value in saturation. */
export const MOS_CHANNEL_NOISE_FACTOR = 2 / 3;

/** One noise current source of a part. */
export interface NoiseSource {
  /** Index of the part in the circuit's part list (contributors are summed per part). */
  part: number;
  /** Rows of the two terminals the noise current flows between (−1 for ground). */
  a: number;
  b: number;
  /** White power spectral density, A²/Hz. */
  white: number;
  /** Flicker corner in Hz (0: none): the density is white·(1 + corner/f). */
  corner: number;
}

/** Power spectral density of a source at `freqHz`, A²/Hz. */
export function sourceDensity(s: NoiseSource, freqHz: number): number {
  return s.corner > 0 ? s.white * (1 + s.corner / freqHz) : s.white;
}

/** A model's flicker corner as a finite, non-negative number (0 when absent). */
function cornerOf(model: { flickerCorner?: number }): number {
  const fc = model.flickerCorner;
  return fc !== undefined && Number.isFinite(fc) && fc > 0 ? fc : 0;
}

/** Every noise source of `circuit` at `op`, rows as in `system`. */
export function noiseSources(circuit: Circuit, op: OperatingPoint, system: LinearSystem): NoiseSource[] {
  const fourKT = 4 * BOLTZMANN * kelvin(circuit.options.temp);
  const twoQ = 2 * ELEMENTARY_CHARGE;
  const row = (node: string) => (node === GROUND ? -1 : system.nodeIndex.get(node) ?? -1);
  const devices = op.report.devices;
  const finite = (x: number) => (Number.isFinite(x) ? Math.abs(x) : 0);
  const out: NoiseSource[] = [];
  circuit.parts.forEach((p, part) => {
    switch (p.kind) {
      case 'res':
        // The conductance the engine stamps (a 0 Ω resistor is held finite there too).
        out.push({ part, a: row(p.a), b: row(p.b), white: fourKT * Math.abs(conductanceOf(p.value)), corner: 0 });
        break;
      case 'npn':
      case 'pnp': {
        const d = devices[p.name] as BjtOp | undefined;
        if (!d) break;
        const internal = system.nodeIndex.get(internalBaseName(p.name));
        const base = internal ?? row(p.b);
        if (internal !== undefined) out.push({ part, a: row(p.b), b: internal, white: fourKT / p.model.rb, corner: 0 });
        out.push({ part, a: row(p.c), b: row(p.e), white: twoQ * finite(d.ic), corner: 0 });
        out.push({ part, a: base, b: row(p.e), white: twoQ * finite(d.ib), corner: cornerOf(p.model) });
        break;
      }
      case 'nmos':
      case 'pmos': {
        const d = devices[p.name] as MosOp | undefined;
        if (!d) break;
        out.push({ part, a: row(p.d), b: row(p.s), white: fourKT * MOS_CHANNEL_NOISE_FACTOR * finite(d.gm), corner: cornerOf(p.model) });
        break;
      }
      case 'diode': {
        const d = devices[p.name] as DiodeOp | undefined;
        if (!d) break;
        out.push({ part, a: row(p.a), b: row(p.k), white: twoQ * finite(d.id), corner: cornerOf(p.model) });
        break;
      }
      default:
        break;
    }
  });
  return out;
}
