/**
 * The sweeps' part of `npm run bench`: the time of a 10-value `analyze vary` and of a 10-value
 * `analyze temp` on the cascoded demo netlist, each against one plain solve of it. Target: at
 * most 11× (the text is read and its library resolved once; each value costs one run).
 */
import { CASCODED_FOLLOWER } from '../src/app/bench/examples/cascoded-follower';
import { solveNetlist } from '../solver';
import { medianMs } from './timing';

const TEN_VALUES = {
  vary: 'analyze vary rc over 6k 6.5k 7k 7.5k 8k 8.5k 9k 9.5k 10k 10.5k',
  temp: 'analyze temp over -40 -20 0 20 27 40 60 85 105 125',
};


/** Prints the sweep rows and returns whether both met the target. */
export function benchSweeps(): boolean {
  // The demo's own sweep line is taken out: "one solve" is the circuit's run alone.
  const plain = CASCODED_FOLLOWER.text.replace(/^analyze (vary|temp|mismatch|sensitivity) .*$/gm, '');
  if (/^analyze (vary|temp)/m.test(plain)) throw new Error('the plain text still sweeps');
  const one = medianMs(() => solveNetlist(plain), 15);
  console.log(`\nSweeps on the cascoded demo (ac 10 Hz–1 GHz, 20 per decade): one solve ${one.toFixed(1)} ms`);
  let ok = true;
  for (const [kind, line] of Object.entries(TEN_VALUES)) {
    const text = `${plain}\n${line}\n`;
    const result = solveNetlist(text);
    if (result.errors.length) throw new Error(`${kind}: ${result.errors.map((e) => e.message).join('; ')}`);
    const ms = medianMs(() => solveNetlist(text), 7);
    // The plain solve is inside the sweep's time too: the ratio counts it.
    const ratio = ms / one;
    ok &&= ratio <= 11;
    console.log(`  ${kind.padEnd(4)} 10 values: ${ms.toFixed(1)} ms = ${ratio.toFixed(1)}× one solve (target ≤ 11×) ${ratio <= 11 ? 'met' : 'NOT met'}`);
  }
  return ok;
}
