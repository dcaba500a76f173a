/**
 * `npm test`: everything, on real parts. Starts the project's PostgreSQL (each test project then
 * makes its own fresh database), runs the Vitest projects (solver, api), the Angular unit tests
 * and the browser end-to-end tests, and ends with one line `N passed, N failed`.
 * Exit code 0 only when every step ran and nothing failed.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, startPostgres } from './postgres';

interface Step {
  name: string;
  command: string[];
  report: string;
}

const results = join(ROOT, 'test-results');
const tmp = join(ROOT, '.tmp');
mkdirSync(results, { recursive: true });
mkdirSync(tmp, { recursive: true });

const vitest = join(ROOT, 'node_modules', '.bin', 'vitest');
const ng = join(ROOT, 'node_modules', '.bin', 'ng');
const only = process.argv.slice(2);
const steps: Step[] = [
  { name: 'solver', command: [vitest, 'run', '--project', 'solver', '--reporter=default', '--reporter=json', `--outputFile.json=${join(results, 'solver.json')}`], report: 'solver.json' },
  { name: 'api', command: [vitest, 'run', '--project', 'api', '--reporter=default', '--reporter=json', `--outputFile.json=${join(results, 'api.json')}`], report: 'api.json' },
  { name: 'app', command: [ng, 'test', '--watch=false', '--no-progress'], report: 'app-unit.json' },
  { name: 'e2e', command: [vitest, 'run', '--project', 'e2e', '--reporter=default', '--reporter=json', `--outputFile.json=${join(results, 'e2e.json')}`], report: 'e2e.json' },
].filter((s) => only.length === 0 || only.includes(s.name));

const pg = startPostgres();
let passed = 0;
let failed = 0;
let skipped = 0;
const lines: string[] = [];
const started = Date.now();
try {
  for (const step of steps) {
    const report = join(results, step.report);
    rmSync(report, { force: true });
    const t0 = Date.now();
    console.log(`\n── ${step.name} ──`);
    const r = spawnSync(step.command[0], step.command.slice(1), {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, TMPDIR: tmp, NG_CLI_ANALYTICS: 'false', FORCE_COLOR: process.env.FORCE_COLOR ?? '0' },
    });
    const seconds = ((Date.now() - t0) / 1000).toFixed(1);
    if (!existsSync(report)) {
      failed += 1;
      lines.push(`${step.name}: did not report (exit ${r.status}) — counted as 1 failure (${seconds} s)`);
      continue;
    }
    const json = JSON.parse(readFileSync(report, 'utf8')) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests?: number; numTotalTestSuites: number; success: boolean };
    passed += json.numPassedTests;
    failed += json.numFailedTests;
    skipped += json.numPendingTests + (json.numTodoTests ?? 0);
    // A suite that failed to load reports no failed test; count it so the run cannot look green.
    const brokenSuite = r.status !== 0 && json.numFailedTests === 0 ? 1 : 0;
    failed += brokenSuite;
    lines.push(`${step.name}: ${json.numPassedTests} passed, ${json.numFailedTests + brokenSuite} failed (${seconds} s)`);
  }
} finally {
  pg.stop();
  rmSync(tmp, { recursive: true, force: true });
}

console.log(`\n── summary (${((Date.now() - started) / 1000).toFixed(0)} s) ──`);
for (const l of lines) console.log(l);
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed === 0 && passed > 0 ? 0 : 1);
