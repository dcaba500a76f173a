/**
 * MOS transistor: the square law with channel-length modulation and the body effect.
 *
 *   saturation (VDS ≥ Vov):  ID = ½·k·Vov²·(1 + λ·VDS)
 *   triode (0 ≤ VDS < Vov):  ID = k·(Vov·VDS − VDS²/2)·(1 + λ·VDS)
 *   cut-off (Vov ≤ 0):       ID = 0
 * with k = ucox·(W/L)·m, Vov = VGS − Vth, Vth = vth0 + γ·(√(φ + VSB) − √φ).
 * (Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., ch. 2.) Both branches meet at
 * VDS = Vov in value and slope. When VDS < 0 the drain and source swap roles (the device is
 * symmetric); a pmos is the nmos with every voltage and current negated.
 */
import type { Mosfet } from '../circuit/types';

/** A MOS transistor's resolved parameters. */
export interface MosParams {
  polarity: 1 | -1;
  /** ucox·(W/L)·m in A/V². */
  k: number;
  /** Threshold magnitude at VSB = 0. */
  vth0: number;
  lambda: number;
  gamma: number;
  phi: number;
  /** Absolute capacitances times m. */
  cgs: number;
  cgd: number;
}

/**
 * Channel current in the mirrored (nmos) sense as a function of (vgs, vds, vbs) of the
 * effective source, vds ≥ 0 assumed; derivatives are partials in those coordinates.
 */
export interface MosCore {
  id: number;
  gm: number;
  gds: number;
  gmb: number;
  vth: number;
  vov: number;
  region: 'saturation' | 'triode' | 'cutoff';
}

/**
 * Drain current and its derivatives with respect to the four terminal voltages, in the
 * terminal sense: `id` flows into the drain terminal.
 */
export interface MosEval {
  id: number;
  dIdVg: number;
  dIdVd: number;
  dIdVs: number;
  dIdVb: number;
  /** True when drain and source swapped roles (VDS < 0 in the device's own sense). */
  swapped: boolean;
  core: MosCore;
}

/** Below this, √(φ + VSB) is held so the body-effect slope stays finite under forward body bias. */
const MIN_SQRT_ARG = 1e-6;

/** Resolves a MOS part's parameters. */
export function mosParams(part: Mosfet): MosParams {
  const md = part.model;
  return {
    polarity: part.kind === 'nmos' ? 1 : -1,
    k: (md.ucox * part.w * part.m) / part.l,
    vth0: md.vth,
    lambda: md.lambda,
    gamma: md.gamma > 0 ? md.gamma : 0,
    phi: md.phi > 0 ? md.phi : 0,
    cgs: md.cgs * part.m,
    cgd: md.cgd * part.m,
  };
}

/** Square law in the effective-source frame (nmos sense, vds ≥ 0). */
export function evalMosCore(p: MosParams, vgs: number, vds: number, vbs: number, out: MosCore): MosCore {
  let vth = p.vth0;
  let dVthDVbs = 0;
  if (p.gamma > 0) {
    const arg = p.phi - vbs;
    const root = Math.sqrt(Math.max(arg, MIN_SQRT_ARG));
    vth = p.vth0 + p.gamma * (root - Math.sqrt(p.phi));
    // dVth/dVBS = −γ / (2√(φ − VBS)); held at the floor value below it.
    dVthDVbs = arg > MIN_SQRT_ARG ? -p.gamma / (2 * root) : 0;
  }
  const vov = vgs - vth;
  out.vth = vth;
  out.vov = vov;
  if (vov <= 0) {
    out.id = 0;
    out.gm = 0;
    out.gds = 0;
    out.gmb = 0;
    out.region = 'cutoff';
    return out;
  }
  const clm = 1 + p.lambda * vds;
  if (vds >= vov) {
    out.id = 0.5 * p.k * vov * vov * clm;
    out.gm = p.k * vov * clm;
    out.gds = 0.5 * p.k * vov * vov * p.lambda;
    out.region = 'saturation';
  } else {
    const f = vov * vds - 0.5 * vds * vds;
    out.id = p.k * f * clm;
    out.gm = p.k * vds * clm;
    out.gds = p.k * ((vov - vds) * clm + f * p.lambda);
    out.region = 'triode';
  }
  // ∂ID/∂VBS = ∂ID/∂Vov · (−∂Vth/∂VBS) = gm · (−dVth/dVBS).
  out.gmb = -out.gm * dVthDVbs;
  return out;
}

/**
 * Evaluates the device at terminal voltages (vg, vd, vs, vb), handling polarity and the
 * drain/source swap; fills terminal-sense current and derivatives.
 */
export function evalMos(p: MosParams, vg: number, vd: number, vs: number, vb: number, out: MosEval): MosEval {
  const s = p.polarity;
  const g = s * vg;
  const d = s * vd;
  const src = s * vs;
  const b = s * vb;
  const c = out.core;
  if (d >= src) {
    evalMosCore(p, g - src, d - src, b - src, c);
    out.swapped = false;
    out.id = s * c.id;
    out.dIdVg = c.gm;
    out.dIdVd = c.gds;
    out.dIdVb = c.gmb;
    out.dIdVs = -(c.gm + c.gds + c.gmb);
  } else {
    // The terminal called drain acts as the source: current flows the other way.
    evalMosCore(p, g - d, src - d, b - d, c);
    out.swapped = true;
    out.id = -s * c.id;
    out.dIdVg = -c.gm;
    out.dIdVs = -c.gds;
    out.dIdVb = -c.gmb;
    out.dIdVd = c.gm + c.gds + c.gmb;
  }
  return out;
}

/** A fresh evaluation record (allocate once per device, reuse per iteration). */
export function newMosEval(): MosEval {
  return {
    id: 0,
    dIdVg: 0,
    dIdVd: 0,
    dIdVs: 0,
    dIdVb: 0,
    swapped: false,
    core: { id: 0, gm: 0, gds: 0, gmb: 0, vth: 0, vov: 0, region: 'cutoff' },
  };
}
