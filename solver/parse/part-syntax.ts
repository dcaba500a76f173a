/**
 * Syntax of part lines `NAME: KIND(connections) [main value] [key=value ...]` and model lines
 * `model NAME: KIND(key=value, ...)`. Only the shape is checked here; kinds, pins, keys and values
 * are checked by the elaborator, which knows the blocks and models in scope.
 */
import type { DiagnosticBag, DiagnosticCode } from '../circuit/diagnostic';
import type { Connection, KeyValue, ModelStmt, Name, PartStmt, ValueText } from './ast';
import type { LogicalLine } from './lines';
import type { Token } from './tokens';

/** Location helpers bound to one logical line. */
export class LineContext {
  constructor(
    readonly line: LogicalLine,
    readonly tokens: Token[],
    readonly bag: DiagnosticBag,
  ) {}

  name(t: Token): Name {
    return { text: t.text, loc: this.line.loc(t.start, t.end) };
  }

  /** A value spanning tokens [from, to). */
  value(from: number, to: number): ValueText {
    const first = this.tokens[from];
    const last = this.tokens[to - 1];
    const text = this.line.text.slice(first.start, last.end);
    return { text, line: this.line, start: first.start, loc: this.line.loc(first.start, last.end) };
  }

  /** A value spanning raw offsets [start, end) of the line, trimmed. */
  rawValue(start: number, end: number): ValueText | undefined {
    const raw = this.line.text.slice(start, end);
    const lead = raw.length - raw.trimStart().length;
    const text = raw.trim();
    if (text === '') return undefined;
    const s = start + lead;
    return { text, line: this.line, start: s, loc: this.line.loc(s, s + text.length) };
  }

  error(code: DiagnosticCode, t: Token | undefined, message: string, hint?: string): void {
    const loc = t ? this.line.loc(t.start, t.end) : this.line.loc(this.line.text.trimEnd().length);
    this.bag.error(code, loc, message, hint);
  }
}

/** `ident` (no dots) test. */
function isPlainIdent(t: Token | undefined): boolean {
  return !!t && t.type === 'ident' && !t.text.includes('.');
}

/** Index of the `)` closing the `(` at `open`, or -1. */
function closingParen(tokens: Token[], open: number): number {
  let depth = 0;
  for (let k = open; k < tokens.length; k++) {
    if (tokens[k].text === '(') depth++;
    else if (tokens[k].text === ')' && --depth === 0) return k;
  }
  return -1;
}

/** Splits tokens (from, to) on top-level commas into index ranges. */
function splitCommas(tokens: Token[], from: number, to: number): [number, number][] {
  const groups: [number, number][] = [];
  let depth = 0;
  let start = from;
  for (let k = from; k < to; k++) {
    const t = tokens[k].text;
    if (t === '(') depth++;
    else if (t === ')') depth--;
    else if (t === ',' && depth === 0) {
      groups.push([start, k]);
      start = k + 1;
    }
  }
  groups.push([start, to]);
  return groups;
}

/** Parses `key=value` items of a model's parenthesised list. */
function parseKeyList(ctx: LineContext, from: number, to: number): KeyValue[] {
  const keys: KeyValue[] = [];
  const { tokens } = ctx;
  if (from === to) return keys;
  for (const [a, b] of splitCommas(tokens, from, to)) {
    if (a === b) {
      ctx.error('syntax', tokens[a] ?? tokens[to], 'An empty item in the parameter list.', 'remove the extra `,`');
      continue;
    }
    if (!isPlainIdent(tokens[a]) || tokens[a + 1]?.text !== '=') {
      ctx.error('syntax', tokens[a], `Expected \`key=value\`, found \`${tokens[a].text}\`.`);
      continue;
    }
    const key = ctx.name(tokens[a]);
    if (a + 2 >= b) {
      ctx.error('missing-value', tokens[a + 1], `\`${key.text}=\` has no value.`);
      keys.push({ key });
    } else keys.push({ key, value: ctx.value(a + 2, b) });
  }
  return keys;
}

/** `model NAME: KIND(key=value, ...)`; tokens[0] is `model`. */
export function parseModelLine(ctx: LineContext): ModelStmt | undefined {
  const { tokens } = ctx;
  if (!isPlainIdent(tokens[1])) {
    ctx.error('syntax', tokens[1], 'A model line reads `model NAME: KIND(key=value, ...)`.');
    return undefined;
  }
  if (tokens[2]?.text !== ':' || !isPlainIdent(tokens[3])) {
    ctx.error('syntax', tokens[2] ?? tokens[1], `Expected \`: KIND(...)\` after the model name \`${tokens[1].text}\`.`, 'a model line reads `model NAME: KIND(key=value, ...)`');
    // The name is known: parts that use it are not told again that it is unknown.
    const name = ctx.name(tokens[1]);
    return { kind: 'model', name, deviceKind: name, keys: [], loc: ctx.line.loc(tokens[0].start, tokens[0].end), broken: true };
  }
  const name = ctx.name(tokens[1]);
  const deviceKind = ctx.name(tokens[3]);
  let keys: KeyValue[] = [];
  if (tokens.length > 4) {
    if (tokens[4].text !== '(') {
      ctx.error('syntax', tokens[4], `Expected \`(\` after \`${deviceKind.text}\`.`);
    } else {
      const close = closingParen(tokens, 4);
      if (close < 0) {
        ctx.error('syntax', tokens[tokens.length - 1], 'The parameter list is never closed.', 'add the missing `)`');
        keys = parseKeyList(ctx, 5, tokens.length);
      } else {
        keys = parseKeyList(ctx, 5, close);
        if (close + 1 < tokens.length) ctx.error('syntax', tokens[close + 1], `Unexpected \`${tokens[close + 1].text}\` after the parameter list.`);
      }
    }
  }
  return { kind: 'model', name, deviceKind, keys, loc: ctx.line.loc(tokens[0].start, tokens[0].end) };
}

/**
 * Parses the connection list between `(` at `open` and `)` at `close`; `broken` when it found a
 * problem, which it reports unless `quiet` (a list that is never closed has said all there is).
 */
function parseConnections(ctx: LineContext, open: number, close: number, quiet = false): { conns: Connection[]; broken: boolean } {
  const { tokens } = ctx;
  const conns: Connection[] = [];
  let broken = false;
  const fail = (t: Token | undefined, code: DiagnosticCode, message: string, hint?: string): void => {
    if (!quiet) ctx.error(code, t, message, hint);
    broken = true;
  };
  if (close === open + 1) return { conns, broken };
  for (const [a, b] of splitCommas(tokens, open + 1, close)) {
    if (a === b) {
      fail(tokens[a], 'syntax', 'An empty connection.', 'remove the extra `,`');
      continue;
    }
    const t0 = tokens[a];
    if (b - a === 1 && t0.type === 'ident') {
      if (t0.text.includes('.')) fail(t0, 'syntax', `\`${t0.text}\` is not a node name here: nodes inside a block instance cannot be reached from outside.`);
      else conns.push({ node: ctx.name(t0) });
    } else if (isPlainIdent(t0) && tokens[a + 1]?.text === '=') {
      if (b - a === 2) {
        fail(tokens[a + 1], 'missing-value', `Pin \`${t0.text}=\` has no node.`);
      } else if (b - a === 3 && isPlainIdent(tokens[a + 2])) {
        conns.push({ pin: ctx.name(t0), node: ctx.name(tokens[a + 2]) });
      } else {
        fail(tokens[a + 2], 'syntax', `Expected a node name after \`${t0.text}=\`.`);
      }
    } else {
      fail(t0, 'syntax', `Expected a node name or \`pin=node\`, found \`${t0.text}\`.`);
    }
  }
  return { conns, broken };
}

/** Groups tokens into whitespace-separated words; `@` joins its neighbours (`ac=1 @ 90`). */
function words(tokens: Token[], from: number): [number, number][] {
  const out: [number, number][] = [];
  for (let k = from; k < tokens.length; k++) {
    const t = tokens[k];
    const prev = tokens[k - 1];
    const joins = out.length > 0 && (!t.spaceBefore || t.text === '@' || prev?.text === '@' || t.text === '=' || prev?.text === '=');
    if (joins) out[out.length - 1][1] = k + 1;
    else out.push([k, k + 1]);
  }
  return out;
}

/** `NAME: KIND(connections) [main value] [key=value ...]`. */
export function parsePartLine(ctx: LineContext): PartStmt | undefined {
  const { tokens } = ctx;
  const name = ctx.name(tokens[0]);
  if (tokens[0].text.includes('.')) {
    ctx.error('syntax', tokens[0], `A part name cannot contain a dot: \`${tokens[0].text}\`.`, 'dotted names are made by block instances');
    return undefined;
  }
  if (!isPlainIdent(tokens[2])) {
    ctx.error('syntax', tokens[2] ?? tokens[1], `Expected a kind after \`${name.text}:\`.`, 'a part line reads `name: kind(connections) value`');
    return undefined;
  }
  const partKind = ctx.name(tokens[2]);
  if (tokens[3]?.text !== '(') {
    ctx.error('syntax', tokens[3] ?? tokens[2], `Expected \`(\` and the connections after \`${partKind.text}\`.`, 'a part line reads `name: kind(connections) value`');
    return undefined;
  }
  let close = closingParen(tokens, 3);
  let rest: number;
  const unclosed = close < 0;
  if (unclosed) {
    ctx.error('syntax', tokens[3], 'The connection list is never closed.', 'add the missing `)`');
    close = tokens.length;
    rest = tokens.length;
  } else rest = close + 1;
  // An unclosed list swallows the rest of the line: its nodes are kept (so that their other parts
  // are not said to hang by one connection), but what it holds is not worth a message of its own.
  const { conns, broken } = parseConnections(ctx, 3, close, unclosed);
  const endTok = tokens[Math.min(close, tokens.length - 1)];
  const connsLoc = ctx.line.loc(tokens[3].start, endTok.end);
  let main: ValueText | undefined;
  const keys: KeyValue[] = [];
  for (const [a, b] of words(tokens, rest)) {
    const eq = tokens.slice(a, b).findIndex((t) => t.text === '=');
    if (eq < 0) {
      if (main) ctx.error('syntax', tokens[a], `Unexpected \`${ctx.line.text.slice(tokens[a].start, tokens[b - 1].end)}\`: a part has one main value.`, 'write further values as `key=value`');
      else main = ctx.value(a, b);
      continue;
    }
    if (eq !== 1 || !isPlainIdent(tokens[a])) {
      ctx.error('syntax', tokens[a], `Expected \`key=value\`, found \`${ctx.line.text.slice(tokens[a].start, tokens[b - 1].end)}\`.`);
      continue;
    }
    const key = ctx.name(tokens[a]);
    if (a + 2 >= b) {
      ctx.error('missing-value', tokens[a + 1], `\`${key.text}=\` has no value.`);
      keys.push({ key });
    } else keys.push({ key, value: ctx.value(a + 2, b) });
  }
  const connsBroken = unclosed ? 'unclosed' : broken ? 'syntax' : undefined;
  return { kind: 'part', name, partKind, conns, connsLoc, ...(connsBroken ? { connsBroken } : {}), main, keys, loc: name.loc };
}
