/**
 * How large a circuit the engine can hold, counted in MNA unknowns, and how a part adds to that
 * count. The elaborator counts as blocks expand and stops a circuit over the cap before any
 * matrix is allocated (a kilobyte of nested blocks can name tens of thousands of nodes). The
 * engine re-exports the cap
 * (analysis/engine-api.ts); an engine that holds more raises it here.
 */
import type { Part } from './types';

/**
 * Most MNA unknowns (node voltages, internal base nodes and branch currents) a circuit may
 * have. Memory no longer sets it: the sparse engine (numeric/sparse-lu.ts) holds O(nonzeros),
 * not size² — a circuit's pattern has about 4–6 entries per unknown and its LU factors 10–30
 * with fill, each a few 8-byte values and 4-byte indices (Newton matrix and factors, G and C,
 * the complex AC factors). Measured: a 9,908-unknown chain of differential stages adds 12 MB of
 * heap for its operating point and AC solver, where the former dense engine needed 800 MB per
 * matrix (32 MB each at the former cap of 2,000). Time sets it instead: that chain's operating
 * point takes 0.7 s and each AC point 6 ms (`npm run bench` machine), so 5,000 unknowns keep a
 * solve per keystroke well under a second. (The elaborator counts a refused circuit up to ten
 * times the cap, which must stay within what MAX_PARTS parts can name.) Only the poles analysis
 * still works densely, under its own cap (analysis/poles-zeros.ts MAX_POLES_UNKNOWNS).
 */
export const MAX_UNKNOWNS = 5000;

/**
 * Unknowns a part adds besides its nodes: the branch current of a voltage source, an inductor
 * or a vcvs, the internal base node of a bipolar transistor with a base resistance (the layout
 * of analysis/mna.ts).
 */
export function partExtraUnknowns(p: Part): number {
  switch (p.kind) {
    case 'vsrc': case 'ind': case 'vcvs': return 1;
    case 'npn': case 'pnp': return p.model.rb > 0 && Number.isFinite(p.model.rb) ? 1 : 0;
    default: return 0;
  }
}
