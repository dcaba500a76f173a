import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DIAGNOSTIC_CODES, diagnostic } from './diagnostic';

const SOLVER = join(__dirname, '..');

/** The solver's own sources (tests excluded). */
function sources(dir = SOLVER): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sources(path);
    return name.endsWith('.ts') && !name.endsWith('.test.ts') ? [path] : [];
  });
}

/** A kebab-case string literal that stands where a diagnostic code goes. */
const CODE_ARGUMENT = /(?:\b(?:error|warning|warn|fail|report|diag|diagnostic)\(\s*(?:[\w.?[\]]+,\s*)?(?:'(?:error|warning)',\s*)?|code: )'([a-z]+(?:-[a-z]+)*)'/g;

describe('diagnostic codes', () => {
  const files = sources().map((path) => ({ path: relative(SOLVER, path), text: readFileSync(path, 'utf8') }));

  it('the factory keeps endCol and hint only when known', () => {
    expect(diagnostic('error', 'syntax', { line: 3, col: 2 }, 'Bad.')).toEqual({ severity: 'error', code: 'syntax', line: 3, col: 2, message: 'Bad.' });
    expect(Object.keys(diagnostic('warning', 'single-connection', { line: 1, col: 1, endCol: 4 }, 'One.', 'hint'))).toEqual(['severity', 'code', 'line', 'col', 'endCol', 'message', 'hint']);
  });

  it('every diagnostic is made by the one factory, not as an object literal', () => {
    const literal = files.filter((f) => f.path !== join('circuit', 'diagnostic.ts') && /severity: '(error|warning)'\s*,/.test(f.text));
    expect(literal.map((f) => f.path)).toEqual([]);
  });

  it('every code written in the sources is in the union, and every code of the union is written somewhere', () => {
    const written = new Set<string>();
    for (const f of files) {
      if (f.path === join('circuit', 'diagnostic.ts')) continue;
      for (const m of f.text.matchAll(CODE_ARGUMENT)) written.add(m[1]);
    }
    const known = new Set<string>(DIAGNOSTIC_CODES);
    expect([...written].filter((c) => !known.has(c) && c !== 'error' && c !== 'warning')).toEqual([]);
    expect(DIAGNOSTIC_CODES.filter((c) => !written.has(c))).toEqual([]);
    expect(new Set(DIAGNOSTIC_CODES).size).toBe(DIAGNOSTIC_CODES.length);
  });
});
