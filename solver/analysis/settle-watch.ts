/**
 * What failed to settle when a DC solve does not converge: the nodes whose Kirchhoff current
 * balance is still off at the last Newton iterate, and the devices whose junction voltages kept
 * moving over the last few iterations. A designer fixes a bias by looking at those nodes and
 * devices, so the failure message names them rather than whichever rows happen to be largest.
 */
import type { SourceLoc } from '../circuit/diagnostic';
import type { MnaLayout } from './mna';
import { ABS_CURRENT_TOL, type NewtonWorkspace } from './newton';

/** Newton iterations over which a device's movement is judged. */
export const SETTLE_WINDOW = 5;
/** A junction voltage that swings less than this over the window has settled, in volts. */
export const SETTLED_SWING = 1e-6;

/** A device still moving: its name, where it is written, the junction that moved most and by how much. */
export interface Unsettled {
  name: string;
  loc: SourceLoc;
  junction: string;
  swing: number;
}

/** A node whose currents do not add up: its name and the net current left over, in amperes. */
export interface Unbalanced {
  name: string;
  residual: number;
}

/** Labels of the two junction voltages each device family keeps, in DeviceSet order. */
const BJT_LABELS = ['VBE', 'VBC'] as const;
const MOS_LABELS = ['VGS', 'VGD'] as const;
const DIODE_LABELS = ['VD', 'VD'] as const;

/**
 * Records the junction voltages of every nonlinear device at each Newton iteration, keeping the
 * last SETTLE_WINDOW of them in a ring, and reports the devices that moved most. Cheap enough to
 * run on every solve (a few stores per device per iteration); {@link reset} reuses it.
 */
export class SettleWatch {
  private readonly ring: Float64Array;
  private readonly width: number;
  private count = 0;

  constructor(private readonly ws: NewtonWorkspace) {
    this.width = 2 * ws.devices.count;
    this.ring = new Float64Array(SETTLE_WINDOW * this.width);
  }

  /** Forgets what was recorded, for the next solve on the same workspace. */
  reset(): void {
    this.count = 0;
  }

  /** Stores the junction voltages the devices were just linearised at. */
  record(): void {
    const { bjts, mos, diodes } = this.ws.devices;
    const ring = this.ring;
    let k = (this.count % SETTLE_WINDOW) * this.width;
    for (const q of bjts) { ring[k++] = q.vbe; ring[k++] = q.vbc; }
    for (const m of mos) { ring[k++] = m.vgs; ring[k++] = m.vgd; }
    for (const d of diodes) { ring[k++] = d.vd; ring[k++] = d.vd; }
    this.count++;
  }

  /** The devices whose junction voltages swung most over the recorded window, most first. */
  unsettled(limit = 3): Unsettled[] {
    const rows = Math.min(this.count, SETTLE_WINDOW);
    if (rows < 2) return [];
    const { bjts, mos, diodes } = this.ws.devices;
    const devices = [
      ...bjts.map((q) => ({ part: q.part, labels: BJT_LABELS })),
      ...mos.map((m) => ({ part: m.part, labels: MOS_LABELS })),
      ...diodes.map((d) => ({ part: d.part, labels: DIODE_LABELS })),
    ];
    const out: Unsettled[] = [];
    devices.forEach(({ part, labels }, k) => {
      let best = { junction: labels[0] as string, swing: 0 };
      for (const side of [0, 1]) {
        let lo = Infinity;
        let hi = -Infinity;
        for (let r = 0; r < rows; r++) {
          const v = this.ring[r * this.width + 2 * k + side];
          if (v < lo) lo = v;
          if (v > hi) hi = v;
        }
        const swing = hi - lo;
        if (Number.isFinite(swing) && swing > best.swing) best = { junction: labels[side], swing };
      }
      if (best.swing > SETTLED_SWING) out.push({ name: part.name, loc: part.loc, ...best });
    });
    return out.sort((a, b) => b.swing - a.swing).slice(0, limit);
  }
}

/**
 * The nodes whose KCL residual at the last iterate exceeds the convergence tolerance, largest
 * first. Rows held by a voltage source balance through its branch current, so a supply node never
 * shows here with a "residual" of 0 A.
 */
export function unbalancedNodes(ws: NewtonWorkspace, layout: MnaLayout, limit = 3): Unbalanced[] {
  const { relTol } = ws.circuit.options;
  const out: Unbalanced[] = [];
  for (let i = 0; i < layout.voltageCount; i++) {
    const r = ws.residual[i];
    if (!Number.isFinite(r) || Math.abs(r) <= relTol * ws.scale[i] + ABS_CURRENT_TOL) continue;
    out.push({ name: layout.rowNames[i], residual: r });
  }
  return out.sort((a, b) => Math.abs(b.residual) - Math.abs(a.residual)).slice(0, limit);
}
