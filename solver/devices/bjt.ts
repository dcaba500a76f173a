/**
 * Bipolar transistor: Ebers–Moll transport form with the Early factor on the transport current.
 *
 *   IT = IS·(exp(VBE/nVT) − exp(VBC/nVT))·(1 + VCE/VA)
 *   IC = IT − (IS/βR)·(exp(VBC/nVT) − 1)
 *   IB = (IS/βF)·(exp(VBE/nVT) − 1) + (IS/βR)·(exp(VBC/nVT) − 1)
 *   IE = IC + IB (out of the emitter)
 *
 * With VA = ∞ this is the textbook transport model (Sedra & Smith, Microelectronic Circuits,
 * 7th ed., §6.2 / Ebers–Moll appendix). A pnp is the npn with every voltage and current negated:
 * the model is evaluated on (VEB, VCB) and the currents flip sign, so the Jacobian is the same.
 * The small-signal parameters are the exact derivatives of this model at the operating point.
 */
import type { Bjt } from '../circuit/types';
import { criticalVoltage, expm1Value, expSlope } from './junction';
import { saturationCurrentAt, thermalVoltage } from './temperature';

/** Reported output resistance when the model has none (va = ∞ or a zero slope): JSON must stay finite. */
export const RESISTANCE_CAP = 1e30;

/** A bipolar transistor's parameters at the analysis temperature. */
export interface BjtParams {
  /** +1 for npn, −1 for pnp. */
  polarity: 1 | -1;
  /** IS(T)·area. */
  is: number;
  nvt: number;
  betaF: number;
  betaR: number;
  /** 1/VA, 0 when VA is infinite. */
  invVa: number;
  vcrit: number;
  rb: number;
  /** Constant parts of the capacitances (scaled by area) and the transit time. */
  cje: number;
  cjc: number;
  tauf: number;
}

/**
 * Currents and Jacobian in the npn sense (for a pnp: of the mirrored device), as functions of the
 * intrinsic junction voltages vbe = v(b') − v(e) and vbc = v(b') − v(c) (mirrored for pnp).
 */
export interface BjtEval {
  /** Current into the collector. */
  ic: number;
  /** Current into the (intrinsic) base. */
  ib: number;
  dIcDvbe: number;
  dIcDvbc: number;
  dIbDvbe: number;
  dIbDvbc: number;
}

/** Hybrid-pi parameters: exact derivatives in (VBE, VCE) coordinates. */
export interface BjtSmallSignal {
  /** ∂IC/∂VBE at constant VCE. */
  gm: number;
  /** ∂IB/∂VBE at constant VCE (1/rπ). */
  gpi: number;
  /** ∂IC/∂VCE at constant VBE (1/ro). */
  go: number;
  /** −∂IB/∂VCE at constant VBE (1/rμ): the reverse junction, negligible in the active region. */
  gmu: number;
}

/** Resolves a bipolar part's model at `tempC` (IS(T), n·VT, area scaling). */
export function bjtParams(part: Bjt, tempC: number): BjtParams {
  const m = part.model;
  const area = part.area;
  const is = saturationCurrentAt(m.is, m.eg, m.pt, tempC) * area;
  const nvt = m.n * thermalVoltage(tempC);
  return {
    polarity: part.kind === 'npn' ? 1 : -1,
    is,
    nvt,
    betaF: m.beta,
    betaR: m.betaR,
    invVa: Number.isFinite(m.va) && m.va > 0 ? 1 / m.va : 0,
    vcrit: criticalVoltage(nvt, is),
    rb: m.rb > 0 && Number.isFinite(m.rb) ? m.rb : 0,
    cje: m.cje * area,
    cjc: m.cjc * area,
    tauf: m.tauf,
  };
}

/** Evaluates currents and their exact derivatives at (vbe, vbc), npn sense. */
export function evalBjt(p: BjtParams, vbe: number, vbc: number, out: BjtEval): BjtEval {
  const { is, nvt } = p;
  // exp − 1 forms throughout: exact near 0 V, and e1 − e2 = (e1 − 1) − (e2 − 1).
  const e1 = expm1Value(vbe / nvt);
  const e2 = expm1Value(vbc / nvt);
  const d1 = (is * expSlope(vbe / nvt)) / nvt;
  const d2 = (is * expSlope(vbc / nvt)) / nvt;
  const early = 1 + (vbe - vbc) * p.invVa;
  const transport = is * (e1 - e2);
  const isR = is / p.betaR;
  out.ic = transport * early - isR * e2;
  out.ib = (is / p.betaF) * e1 + isR * e2;
  out.dIcDvbe = d1 * early + transport * p.invVa;
  out.dIcDvbc = -d2 * early - transport * p.invVa - d2 / p.betaR;
  out.dIbDvbe = d1 / p.betaF;
  out.dIbDvbc = d2 / p.betaR;
  return out;
}

/** Converts the (vbe, vbc) Jacobian into hybrid-pi conductances at constant VCE / VBE. */
export function bjtSmallSignal(ev: BjtEval): BjtSmallSignal {
  return {
    gm: ev.dIcDvbe + ev.dIcDvbc,
    gpi: ev.dIbDvbe + ev.dIbDvbc,
    go: -ev.dIcDvbc,
    gmu: ev.dIbDvbc,
  };
}

/** Cπ = cje + gm·τF (gm clipped at 0 so a reversed device never reports a negative capacitance). */
export function bjtCpi(p: BjtParams, gm: number): number {
  return p.cje + Math.max(gm, 0) * p.tauf;
}

/** 1/g as a finite resistance: capped at {@link RESISTANCE_CAP} when g is zero, tiny or negative. */
export function finiteResistance(g: number): number {
  return g > 1 / RESISTANCE_CAP ? 1 / g : RESISTANCE_CAP;
}
