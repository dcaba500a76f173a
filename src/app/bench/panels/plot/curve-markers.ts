/**
 * The −3 dB corner and the unity crossing of a curve, found exactly as the `corner` and `unity`
 * measures find them (the solver's own functions), so the marks on the plot agree with the
 * measures to the last digit.
 */
import { corner, CORNER_DB, unity, type Curve } from '../../../../../solver';
import { formatSi } from '../si-format';
import { PLOT_COLORS } from './palette';
import type { PlotMarker } from './plot-geometry';

/** The markers of `curve` (named `name`); a crossing outside the sweep is simply not marked. */
export function curveMarkers(name: string, freqHz: number[], curve: Curve): PlotMarker[] {
  const c = { name, freqHz, curve };
  const out: PlotMarker[] = [];
  const f3 = attempt(() => corner(c));
  if (f3 !== undefined) {
    out.push({ kind: 'corner', freqHz: f3, db: curve.db[0] - CORNER_DB, label: `−3 dB at ${formatSi(f3, 'Hz')}`, color: PLOT_COLORS.marker });
  }
  const fu = attempt(() => unity(c));
  if (fu !== undefined) {
    out.push({ kind: 'unity', freqHz: fu, db: 0, label: `0 dB at ${formatSi(fu, 'Hz')}`, color: PLOT_COLORS.marker });
  }
  return out;
}

function attempt(find: () => number): number | undefined {
  try {
    const f = find();
    return Number.isFinite(f) ? f : undefined;
  } catch {
    // The measure functions explain a missing crossing by throwing; on a plot it is just absent.
    return undefined;
  }
}
