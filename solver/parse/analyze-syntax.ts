/**
 * `analyze …` lines (§3): ac, transfer, vary, temp, noise, mismatch, poles.
 */
import type { AnalysisRequest } from '../circuit/analyses';
import type { SourceLoc } from '../circuit/diagnostic';
import type { TokenStmt, ValueText } from './ast';
import { ANALYSES, ANALYSIS_SPECS, MISMATCH_KEYS, type QuantityUnit } from '../language/vocabulary';
import type { RequestContext } from './requests';
import { didYouMean } from './suggest';

/** Most points any sweep may have: more is surely a typo and would stall the bench. */
export const MAX_SWEEP_POINTS = 100_000;
/** More frequency points than this is a typo in the sweep, not a request. */
export const MAX_AC_POINTS = 20_001;
/** More transfer points than this is a typo in the step. */
export const MAX_TRANSFER_POINTS = 20_001;

/** The analyses of the language (§3) and the mismatch keys: from the vocabulary. */
export { ANALYSES, MISMATCH_KEYS };

const USAGE: Record<string, string> = Object.fromEntries(ANALYSIS_SPECS.map((a) => [a.kind, a.syntax]));

/** A word: adjacent tokens with no space between them (a quantity with its unit is one token). */
interface Word { text: string; value: ValueText; loc: SourceLoc }

function wordsOf(s: TokenStmt): Word[] {
  const out: Word[] = [];
  const t = s.tokens;
  let from = t.length > 1 ? 1 : -1;
  const flush = (to: number): void => {
    if (from < 0) return;
    const start = t[from].start;
    const end = t[to - 1].end;
    const text = s.line.text.slice(start, end);
    const loc = s.line.loc(start, end);
    out.push({ text, value: { text, line: s.line, start, loc }, loc });
  };
  for (let k = 2; k < t.length; k++) {
    if (t[k].spaceBefore) {
      flush(k);
      from = k;
    }
  }
  flush(t.length);
  return out;
}

class Cursor {
  k = 0;
  ok = true;
  constructor(readonly ctx: RequestContext, readonly words: Word[], readonly kind: string, readonly end: SourceLoc) {}

  peek(): Word | undefined {
    return this.words[this.k];
  }

  fail(loc: SourceLoc, message: string): void {
    if (this.ok) this.ctx.error('syntax', loc, message, `write e.g. \`${USAGE[this.kind]}\``);
    this.ok = false;
  }

  keyword(word: string): boolean {
    const w = this.peek();
    if (w?.text !== word) {
      this.fail(w?.loc ?? this.end, w ? `Expected \`${word}\`, found \`${w.text}\`.` : `Expected \`${word}\` at the end of the line.`);
      return false;
    }
    this.k++;
    return true;
  }

  name(what: string): Word | undefined {
    const w = this.peek();
    if (!w || !/^[A-Za-z_][A-Za-z0-9_.]*$/.test(w.text)) {
      this.fail(w?.loc ?? this.end, `Expected ${what}${w ? `, found \`${w.text}\`` : ''}.`);
      return undefined;
    }
    this.k++;
    return w;
  }

  number(unit: QuantityUnit | undefined, slot: string, range: 'any' | 'positive' | 'nonnegative' | 'integer' = 'any'): number {
    const w = this.peek();
    if (!w) {
      this.fail(this.end, `Expected ${slot} at the end of the line.`);
      return NaN;
    }
    this.k++;
    const v = this.ctx.number(w.value, unit, slot, range);
    if (Number.isNaN(v)) this.ok = false;
    return v;
  }

  done(): void {
    const w = this.peek();
    if (w) this.fail(w.loc, `Unexpected \`${w.text}\` at the end of the analyze line.`);
  }
}

/** `from A to B per decade N` → log-spaced values. */
function decadeSweep(c: Cursor, unit: QuantityUnit | undefined, what: string): { from: number; to: number; perDecade: number } | undefined {
  if (!c.keyword('from')) return undefined;
  const from = c.number(unit, `the start ${what}`, 'positive');
  if (!c.keyword('to')) return undefined;
  const to = c.number(unit, `the stop ${what}`, 'positive');
  if (!c.keyword('per') || !c.keyword('decade')) return undefined;
  const perDecade = c.number('', 'the points per decade', 'integer');
  if (!c.ok) return undefined;
  if (to <= from) {
    c.fail(c.words[c.k - 4].loc, `The stop ${what} must be above the start ${what}.`);
    return undefined;
  }
  if (Math.log10(to / from) * perDecade + 1 > MAX_SWEEP_POINTS) {
    c.fail(c.words[c.k - 1].loc, `The sweep would have more than ${MAX_SWEEP_POINTS} points.`);
    return undefined;
  }
  return { from, to, perDecade };
}

/** `from A to B step D` → linear values. */
function linearSweep(c: Cursor, unit: QuantityUnit | undefined, what: string): number[] | undefined {
  if (!c.keyword('from')) return undefined;
  const from = c.number(unit, `the start ${what}`);
  if (!c.keyword('to')) return undefined;
  const to = c.number(unit, `the stop ${what}`);
  if (!c.keyword('step')) return undefined;
  const stepWord = c.peek();
  const step = Math.abs(c.number(unit, 'the step', 'any'));
  if (!c.ok) return undefined;
  if (step === 0 && from !== to) {
    c.fail(stepWord?.loc ?? c.end, 'The step must not be zero.');
    return undefined;
  }
  const count = step === 0 ? 1 : Math.floor(Math.abs(to - from) / step + 1e-9) + 1;
  if (count > MAX_SWEEP_POINTS) {
    c.fail(stepWord?.loc ?? c.end, `The sweep would have more than ${MAX_SWEEP_POINTS} points.`);
    return undefined;
  }
  const dir = to >= from ? 1 : -1;
  return Array.from({ length: count }, (_, k) => from + dir * k * step);
}

function decadeValues(s: { from: number; to: number; perDecade: number }): number[] {
  const n = Math.floor(Math.log10(s.to / s.from) * s.perDecade + 1e-9);
  const values = Array.from({ length: n + 1 }, (_, k) => s.from * 10 ** (k / s.perDecade));
  if (values[values.length - 1] < s.to * (1 - 1e-9)) values.push(s.to);
  return values;
}

/** `over v1 v2 …` or a linear / decade sweep. */
function valueList(c: Cursor, unit: QuantityUnit | undefined, what: string): number[] | undefined {
  const w = c.peek();
  if (w?.text === 'over') {
    c.k++;
    const values: number[] = [];
    while (c.peek()) values.push(c.number(unit, what));
    if (values.length === 0) c.fail(c.end, `\`over\` needs at least one ${what}.`);
    return c.ok ? values : undefined;
  }
  const save = c.k;
  if (c.words[save + 4]?.text === 'per') {
    const d = decadeSweep(c, unit, what);
    return d ? decadeValues(d) : undefined;
  }
  if (w?.text !== 'from') {
    c.fail(w?.loc ?? c.end, `Expected \`over\` or \`from\`${w ? `, found \`${w.text}\`` : ''}.`);
    return undefined;
  }
  return linearSweep(c, unit, what);
}

/** Parses one analyze line. */
export function parseAnalyze(ctx: RequestContext, s: TokenStmt): AnalysisRequest | undefined {
  const words = wordsOf(s);
  const end = s.line.loc(s.line.text.trimEnd().length);
  const kindWord = words[0];
  if (!kindWord) {
    ctx.error('missing-value', end, '`analyze` needs the name of an analysis.', `analyses are ${ANALYSES.join(', ')}`);
    return undefined;
  }
  const kind = kindWord.text;
  if (!(ANALYSES as readonly string[]).includes(kind)) {
    ctx.error('unknown-analysis', kindWord.loc, `Unknown analysis \`${kind}\`.`, didYouMean(kind, ANALYSES) ?? `analyses are ${ANALYSES.join(', ')}`);
    return undefined;
  }
  const c = new Cursor(ctx, words, kind, end);
  c.k = 1;
  const loc = s.loc;
  let result: AnalysisRequest | undefined;
  switch (kind) {
    case 'ac': {
      const d = decadeSweep(c, 'Hz', 'frequency');
      if (!d) break;
      const points = Math.log10(d.to / d.from) * d.perDecade + 1;
      if (points > MAX_AC_POINTS) {
        ctx.error('bad-ac-sweep', loc, `analyze ac: the sweep would have ${Math.round(points)} points (at most ${MAX_AC_POINTS}).`, 'use fewer points per decade or a narrower range');
        return undefined;
      }
      result = { kind: 'ac', fromHz: d.from, toHz: d.to, perDecade: d.perDecade, loc };
      break;
    }
    case 'transfer': {
      const src = c.name('the source to sweep');
      if (!src) break;
      const source = ctx.source(src.text, src.loc, '`analyze transfer`');
      const part = ctx.scope.parts.get(src.text);
      const unit = part?.kind === 'isrc' ? 'A' : 'V';
      const values = linearSweep(c, unit, part?.kind === 'isrc' ? 'current' : 'voltage');
      if (!values || !source) break;
      if (values.length < 2) {
        ctx.error('bad-transfer', loc, 'analyze transfer: the step must be non-zero and lead from the start value to the end value.', `write e.g. \`${USAGE.transfer}\``);
        return undefined;
      }
      if (values.length > MAX_TRANSFER_POINTS) {
        ctx.error('bad-transfer', loc, `analyze transfer: the sweep would have ${values.length} points (at most ${MAX_TRANSFER_POINTS}).`, 'use a larger step');
        return undefined;
      }
      result = { kind: 'transfer', source, from: values[0], to: values[values.length - 1], step: values[1] - values[0], loc };
      break;
    }
    case 'vary': {
      const p = c.name('the parameter to vary');
      if (!p) break;
      const known = ctx.scope.params.has(p.text);
      if (!known) ctx.error('unknown-param', p.loc, `Unknown parameter \`${p.text}\`.`, didYouMean(p.text, ctx.scope.params.keys()) ?? 'vary a top-level `param`');
      const values = valueList(c, undefined, 'value');
      if (values && known) result = { kind: 'vary', param: p.text, values, loc };
      break;
    }
    case 'temp': {
      const values = valueList(c, '', 'temperature (°C)');
      if (values?.some((t) => t <= -273.15)) c.fail(kindWord.loc, 'A temperature is below absolute zero.');
      else if (values) result = { kind: 'temp', valuesC: values, loc };
      break;
    }
    case 'noise': {
      if (!c.keyword('out')) break;
      const out = c.name('the output node');
      let outRef: Word | undefined;
      if (c.peek() && c.peek()?.text !== 'in') outRef = c.name('a reference node or `in`');
      if (!c.keyword('in')) break;
      const input = c.name('the input source');
      const d = decadeSweep(c, 'Hz', 'frequency');
      if (!out || !input || !d) break;
      const outNode = ctx.node(out.text, out.loc, false);
      const refNode = outRef ? ctx.node(outRef.text, outRef.loc) : undefined;
      const inSrc = ctx.source(input.text, input.loc, '`analyze noise`');
      if (!outNode || !inSrc || (outRef && !refNode)) break;
      if (refNode === outNode) {
        ctx.error('bad-noise-request', outRef!.loc, `analyze noise: the reference node is the output node \`${outNode}\`, so the output would be 0.`, 'write `out NODE` alone, or `out NODE REF` with another node');
        return undefined;
      }
      // The same grid, and the same limit, as the ac sweep.
      const points = Math.log10(d.to / d.from) * d.perDecade + 1;
      if (points > MAX_AC_POINTS) {
        ctx.error('bad-noise-request', loc, `analyze noise: the sweep would have ${Math.round(points)} points (at most ${MAX_AC_POINTS}).`, 'use fewer points per decade or a narrower range');
        return undefined;
      }
      result = { kind: 'noise', out: outNode, ...(refNode ? { outRef: refNode } : {}), input: inSrc, fromHz: d.from, toHz: d.to, perDecade: d.perDecade, loc };
      break;
    }
    case 'mismatch': {
      let runs = NaN;
      let seed = 1;
      const sigmas: Record<string, number> = {};
      while (c.ok && c.peek()) {
        const key = c.peek() as Word;
        c.k++;
        if (key.text === 'runs') runs = c.number('', 'the number of runs', 'integer');
        else if (key.text === 'seed') seed = c.number('', 'the seed', 'any');
        else if (key.text === 'vth') sigmas.vth = c.number('V', 'the spread of vth (volts, e.g. 2m)', 'nonnegative');
        else if (MISMATCH_KEYS.includes(key.text)) {
          // Relative spreads are written as percentages: a bare 5 would mean 500 %.
          const written = c.peek();
          if (written && !written.text.includes('%')) {
            c.fail(written.loc, `The spread of ${key.text} is a percentage: write it with %, e.g. \`${key.text} ${written.text}%\`.`);
            break;
          }
          sigmas[key.text] = c.number('%', `the spread of ${key.text}`, 'nonnegative');
        }
        else {
          ctx.error('unknown-param', key.loc, `\`${key.text}\` is not a mismatch parameter.`, didYouMean(key.text, ['runs', 'seed', ...MISMATCH_KEYS]) ?? `keys are runs, seed, ${MISMATCH_KEYS.join(', ')}`);
          c.ok = false;
        }
      }
      if (!c.ok) break;
      if (Number.isNaN(runs)) {
        c.fail(kindWord.loc, '`analyze mismatch` needs `runs N`.');
        break;
      }
      if (runs > MAX_SWEEP_POINTS) {
        c.fail(kindWord.loc, `More than ${MAX_SWEEP_POINTS} mismatch runs.`);
        break;
      }
      if (!Number.isInteger(seed)) {
        c.fail(kindWord.loc, 'The seed must be a whole number.');
        break;
      }
      result = { kind: 'mismatch', runs, seed, sigmas, loc };
      break;
    }
    case 'sensitivity':
      result = { kind: 'sensitivity', loc };
      break;
    case 'poles': {
      if (!c.peek()) {
        result = { kind: 'poles', loc };
        break;
      }
      if (!c.keyword('out')) break;
      const out = c.name('the output node');
      const outNode = out ? ctx.node(out.text, out.loc, false) : undefined;
      if (outNode) result = { kind: 'poles', out: outNode, loc };
      else c.ok = false;
      break;
    }
  }
  if (c.ok) c.done();
  return c.ok ? result : undefined;
}
