/**
 * Spec checks: `check LHS OP RHS [± TOL]`.
 *
 * The tolerance widens the pass region for every operator: `x >= 80 ± 1` passes from 79.
 * A relative tolerance (written with %) is a fraction of |limit|. `=` without a tolerance means
 * "equal to within 1 ppm of the limit": exact equality is meaningless for computed values, and a
 * designer who writes `ic(q1) = 2m` means 2 mA as far as the arithmetic goes.
 * The margin is the signed distance to failing in the value's units: positive passes.
 */
import type { CheckRequest } from '../circuit/analyses';
import type { CheckResult } from '../circuit/result';

/** Tolerance for `=` when none is written, relative to the limit. */
export const DEFAULT_EQUAL_TOLERANCE = 1e-6;

/** The result, or a message when the tolerance itself is unusable. */
export function evaluateCheck(req: CheckRequest, value: number, limit: number): CheckResult | string {
  let tol = 0;
  if (req.tol !== undefined) {
    if (!Number.isFinite(req.tol) || req.tol < 0) return 'the tolerance must be a number of 0 or more.';
    tol = req.tolRelative ? req.tol * Math.abs(limit) : req.tol;
  } else if (req.op === '=') {
    tol = Math.max(DEFAULT_EQUAL_TOLERANCE * Math.abs(limit), 1e-300);
  }
  let margin: number;
  let pass: boolean;
  switch (req.op) {
    case '>=':
      margin = value - (limit - tol);
      pass = margin >= 0;
      break;
    case '>':
      margin = value - (limit - tol);
      pass = margin > 0;
      break;
    case '<=':
      margin = limit + tol - value;
      pass = margin >= 0;
      break;
    case '<':
      margin = limit + tol - value;
      pass = margin > 0;
      break;
    case '=':
      margin = tol - Math.abs(value - limit);
      pass = margin >= 0;
      break;
    default:
      return `unknown comparison \`${String(req.op)}\`.`;
  }
  return { text: req.text, pass, value, limit, margin, line: req.loc.line };
}
