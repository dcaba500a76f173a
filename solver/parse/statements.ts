/**
 * Statement parser: logical lines → a FileUnit (title, params, options, models, parts, blocks,
 * uses and the raw requests). Reports syntax problems; never throws.
 */
import type { CheckOp } from '../circuit/analyses';
import type { DiagnosticBag } from '../circuit/diagnostic';
import { GROUND } from '../circuit/types';
import { emptyBody, type BlockDef, type Body, type CheckStmt, type FileUnit, type Name } from './ast';
import { KEYWORDS, STATEMENTS } from '../language/vocabulary';
import { splitLogicalLines, type LogicalLine } from './lines';
import { LineContext, parseModelLine, parsePartLine } from './part-syntax';
import { didYouMean } from './suggest';
import { tokenize } from './tokens';

/** Statements allowed inside `block … end`. */
const BLOCK_STATEMENTS = new Set(STATEMENTS.filter((s) => s.inBlock).map((s) => s.keyword));

/** Deepest block nesting accepted; deeper is surely a mistake (and keeps the elaborator bounded). */
export const MAX_BLOCK_NESTING = 32;

/** Parses one file. `origin` marks a library file (`path@version`). */
export function parseFile(text: string, bag: DiagnosticBag, origin?: string): FileUnit {
  const file: FileUnit = { ...emptyBody(), options: [], uses: [], requests: [], origin };
  const stack: BlockDef[] = [];
  const body = (): Body => stack[stack.length - 1] ?? file;
  for (const line of splitLogicalLines(text)) {
    const tokens = tokenize(line.text);
    if (tokens.length === 0) continue;
    const ctx = new LineContext(line, tokens, bag);
    const first = tokens[0];
    const isPart = first.type === 'ident' && tokens[1]?.text === ':';
    const keyword = isPart || first.type !== 'ident' ? undefined : first.text;
    if (keyword !== undefined && stack.length > 0 && !BLOCK_STATEMENTS.has(keyword) && KEYWORDS.includes(keyword)) {
      ctx.error('not-in-block', first, `\`${keyword}\` is not allowed inside a block.`, `close the block \`${stack[stack.length - 1].name.text}\` with \`end\` first`);
      continue;
    }
    if (isPart) {
      const part = parsePartLine(ctx);
      if (part) body().parts.push(part);
      continue;
    }
    switch (keyword) {
      case 'title': {
        file.title = line.text.slice(first.end).trim();
        break;
      }
      case 'param':
      case 'option': {
        const stmt = parseAssignment(ctx, keyword);
        if (!stmt) break;
        if (keyword === 'param') body().params.push({ kind: 'param', ...stmt });
        else file.options.push({ kind: 'option', ...stmt });
        break;
      }
      case 'model': {
        const model = parseModelLine(ctx);
        if (model) body().models.push(model);
        break;
      }
      case 'block': {
        const block = parseBlockHeader(ctx, file, stack[stack.length - 1]);
        if (!block) break;
        if (stack.length >= MAX_BLOCK_NESTING) {
          ctx.error('syntax', first, `Blocks nest deeper than ${MAX_BLOCK_NESTING} levels.`);
          break;
        }
        body().blocks.push(block);
        stack.push(block);
        break;
      }
      case 'end': {
        const open = stack.pop();
        if (!open) ctx.error('stray-end', first, '`end` without a `block` to close.');
        else if (tokens[1] && tokens[1].text !== open.name.text)
          ctx.error('syntax', tokens[1], `\`end ${tokens[1].text}\` closes the block \`${open.name.text}\`.`, `write \`end\` or \`end ${open.name.text}\``);
        else if (tokens.length > 2) ctx.error('syntax', tokens[2], `Unexpected \`${tokens[2].text}\` after \`end\`.`);
        break;
      }
      case 'use': {
        parseUse(ctx, file);
        break;
      }
      case 'analyze':
      case 'ports': {
        file.requests.push({ kind: keyword, line, tokens, loc: line.loc(first.start, first.end) });
        break;
      }
      case 'measure': {
        if (!tokens[1] || tokens[1].type !== 'ident' || tokens[1].text.includes('.') || tokens[2]?.text !== '=') {
          ctx.error('syntax', tokens[1] ?? first, 'A measure reads `measure NAME = EXPRESSION`.');
          break;
        }
        file.requests.push({ kind: 'measure', name: ctx.name(tokens[1]), expr: ctx.rawValue(tokens[2].end, line.text.length), loc: line.loc(first.start, first.end) });
        if (!ctx.rawValue(tokens[2].end, line.text.length)) ctx.error('missing-value', tokens[2], `The measure \`${tokens[1].text}\` has no expression.`);
        break;
      }
      case 'check': {
        const check = parseCheck(ctx, line);
        if (check) file.requests.push(check);
        break;
      }
      default: {
        const word = first.text;
        const missingColon = first.type === 'ident' && tokens[1]?.type === 'ident' && tokens[2]?.text === '(';
        const hint = missingColon
          ? `a part line reads \`name: kind(connections) value\`: write \`${word}: ${tokens[1].text}(…)\``
          : first.type === 'ident' ? didYouMean(word, KEYWORDS) : undefined;
        ctx.error('unknown-statement', first, `\`${word}\` does not start a statement.`, hint ?? 'a part line reads `name: kind(connections) value`; statements start with title, param, option, model, block, use, analyze, ports, measure or check');
      }
    }
  }
  for (const open of stack) {
    bag.error('unterminated-block', open.name.loc, `The block \`${open.name.text}\` has no \`end\`.`, 'add `end` after its last line');
  }
  return file;
}

/** `param NAME = VALUE` / `option NAME = VALUE`. */
function parseAssignment(ctx: LineContext, keyword: string): { name: Name; value?: ReturnType<LineContext['rawValue']>; loc: Name['loc'] } | undefined {
  const { tokens, line } = ctx;
  const nameTok = tokens[1];
  if (!nameTok || nameTok.type !== 'ident' || nameTok.text.includes('.')) {
    ctx.error('syntax', nameTok, `A ${keyword} line reads \`${keyword} NAME = VALUE\`.`);
    return undefined;
  }
  if (tokens[2]?.text !== '=') {
    ctx.error(tokens[2] ? 'syntax' : 'missing-value', tokens[2] ?? nameTok, `Expected \`=\` and a value after \`${keyword} ${nameTok.text}\`.`);
    return undefined;
  }
  const value = ctx.rawValue(tokens[2].end, line.text.length);
  if (!value) ctx.error('missing-value', tokens[2], `\`${keyword} ${nameTok.text}\` has no value.`);
  return { name: ctx.name(nameTok), value, loc: line.loc(tokens[0].start, tokens[0].end) };
}

/** `block NAME(pin, ...)`. */
function parseBlockHeader(ctx: LineContext, file: FileUnit, parent: BlockDef | undefined): BlockDef | undefined {
  const { tokens } = ctx;
  const nameTok = tokens[1];
  if (!nameTok || nameTok.type !== 'ident' || nameTok.text.includes('.')) {
    ctx.error('syntax', nameTok ?? tokens[0], 'A block reads `block NAME(pin, ...)`.');
    return undefined;
  }
  const pins: Name[] = [];
  const seen = new Set<string>();
  if (tokens[2]?.text !== '(') {
    ctx.error('syntax', tokens[2] ?? nameTok, `Expected \`(\` and the pins after \`block ${nameTok.text}\`.`);
  } else {
    let k = 3;
    let closed = false;
    while (k < tokens.length) {
      const t = tokens[k];
      if (t.text === ')') {
        closed = true;
        k++;
        break;
      }
      if (t.type === 'ident' && !t.text.includes('.')) {
        if (t.text === GROUND) ctx.error('gnd-redefined', t, '`gnd` is the global reference node and cannot be a block pin.');
        else if (seen.has(t.text)) ctx.error('duplicate-name', t, `The pin \`${t.text}\` is listed twice.`);
        else {
          seen.add(t.text);
          pins.push(ctx.name(t));
        }
        const next = tokens[k + 1];
        if (next && next.text !== ',' && next.text !== ')') {
          ctx.error('syntax', next, `Expected \`,\` or \`)\`, found \`${next.text}\`.`);
          k++;
        }
        k += next?.text === ',' ? 2 : 1;
      } else {
        ctx.error('syntax', t, `Expected a pin name, found \`${t.text}\`.`);
        k++;
      }
    }
    if (!closed) ctx.error('syntax', tokens[tokens.length - 1], 'The pin list is never closed.', 'add the missing `)`');
    else if (k < tokens.length) ctx.error('syntax', tokens[k], `Unexpected \`${tokens[k].text}\` after the pin list.`);
  }
  return { kind: 'block', ...emptyBody(), name: ctx.name(nameTok), pins, loc: ctx.name(nameTok).loc, file, parent };
}

const USE_LINE = /^\s*use\s+([A-Za-z0-9_-]+(?:\/[A-Za-z0-9_-]+)*)@(\d+)\s*$/;

/** `use path@version`. */
function parseUse(ctx: LineContext, file: FileUnit): void {
  const { line, tokens } = ctx;
  const m = USE_LINE.exec(line.text);
  if (!m) {
    ctx.error('syntax', tokens[1] ?? tokens[0], 'A use line reads `use path/name@version`, e.g. `use mirrors/wilson_npn@3`.');
    return;
  }
  const path = m[1];
  const blockName = path.slice(path.lastIndexOf('/') + 1);
  const version = Number(m[2]);
  const start = line.text.indexOf(path);
  if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(blockName)) {
    ctx.error('syntax', tokens[1], `The last part of \`${path}\` must be a block name.`);
    return;
  }
  file.uses.push({ kind: 'use', path, version, blockName, loc: line.loc(start, start + path.length) });
}

/** Finds the comparison operator and the `±` tolerance of a check, outside parentheses. */
function parseCheck(ctx: LineContext, line: LogicalLine): CheckStmt | undefined {
  const text = line.text;
  const kw = ctx.tokens[0];
  const bodyStart = kw.end;
  let depth = 0;
  let opAt = -1;
  let op: CheckOp | undefined;
  let tolAt = -1;
  let tolLen = 0;
  for (let k = bodyStart; k < text.length; k++) {
    const c = text[k];
    if (c === '(') depth++;
    else if (c === ')') depth--;
    if (depth !== 0) continue;
    if (opAt < 0) {
      const two = text.slice(k, k + 2);
      if (two === '>=' || two === '<=' || two === '==') {
        op = two === '==' ? '=' : (two as CheckOp);
        opAt = k;
        k++;
      } else if (c === '>' || c === '<' || c === '=') {
        op = c as CheckOp;
        opAt = k;
      }
    } else if (c === '\u00b1' || text.slice(k, k + 2) === '+-') {
      tolAt = k;
      tolLen = c === '\u00b1' ? 1 : 2;
      break;
    }
  }
  if (opAt < 0 || !op) {
    ctx.error('syntax', kw, 'A check compares two sides: `check LHS >= RHS`, with >=, <=, >, < or =.');
    return undefined;
  }
  const opLen = text.slice(opAt, opAt + 2) === '>=' || text.slice(opAt, opAt + 2) === '<=' || text.slice(opAt, opAt + 2) === '==' ? 2 : 1;
  const lhs = ctx.rawValue(bodyStart, opAt);
  const rhs = ctx.rawValue(opAt + opLen, tolAt >= 0 ? tolAt : text.length);
  const tol = tolAt >= 0 ? ctx.rawValue(tolAt + tolLen, text.length) : undefined;
  if (!lhs || !rhs || (tolAt >= 0 && !tol)) {
    const where = !lhs ? bodyStart : !rhs ? opAt : tolAt;
    ctx.bag.error('missing-value', line.loc(where, where + 1), `The check is missing its ${!lhs ? 'left side' : !rhs ? 'right side' : 'tolerance'}.`);
    return undefined;
  }
  return { kind: 'check', text: text.slice(bodyStart).trim().replace(/\s+/g, ' '), lhs, op, rhs, tol, loc: line.loc(kw.start, kw.end) };
}
