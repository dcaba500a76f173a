/**
 * Names for the lines an empty panel suggests (`analyze noise out … in …`, `analyze poles out …`):
 * the ones the ports line gave when there is one, else a guess from the solve's own names that a
 * designer would recognise, else a placeholder in capitals that plainly asks to be filled in.
 */
import type { SolveResult } from '../../../../solver';
import { portNames } from './modes-panel';

/** A supply by its usual name: vcc, vdd, vee, vss (and vcc2 …), never the signal to suggest. */
const SUPPLY = /^v(cc|dd|ee|ss)/i;
/** An output by its usual name: out, outa, vout, vo, vo1 … */
const OUTPUT = /^(v?out|vo(\d|$))/i;

/** The output to suggest: the ports' output (both nodes of a differential one), else a node named like one. */
export function suggestedOutput(result: SolveResult): { node: string; ref?: string } {
  if (result.ports) {
    const names = portNames(result.ports);
    return { node: names.outP, ref: names.outN };
  }
  const node = Object.keys(result.op?.nodes ?? {}).find((n) => OUTPUT.test(n));
  return { node: node ?? 'NODE' };
}

/** The input source to suggest: the first one the ports line drives, else the first voltage source that is not a supply. */
export function suggestedInput(result: SolveResult): string {
  if (result.ports) return portNames(result.ports).inP;
  return Object.keys(result.op?.sources ?? {}).find((n) => !SUPPLY.test(n)) ?? 'SOURCE';
}
