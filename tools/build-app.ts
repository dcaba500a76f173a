/**
 * Builds the Angular app when its output is missing or older than any of its inputs, so a second
 * `npm start` does not rebuild. The solver is an input too: the bench's worker bundles it.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, rmdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT } from './postgres';

export const APP_DIST = join(ROOT, 'dist', 'nodewright', 'browser');
const INPUTS = ['src', 'public', 'solver', 'library', 'docs', 'angular.json', 'tsconfig.json', 'tsconfig.app.json', 'package-lock.json', 'ngsw-config.json'];

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
  return newest;
}

/** Whether dist is older than the sources. */
export function appIsStale(): boolean {
  const index = join(APP_DIST, 'index.html');
  if (!existsSync(index)) return true;
  const built = statSync(index).mtimeMs;
  return INPUTS.some((p) => newestMtime(join(ROOT, p)) > built);
}

const LOCK = join(ROOT, 'dist', '.build-lock');

/** Holds a folder lock so two test runs never build into dist/ at once (stale after 5 minutes). */
function withBuildLock<T>(fn: () => T): T {
  mkdirSync(join(ROOT, 'dist'), { recursive: true });
  const deadline = Date.now() + 10 * 60_000;
  for (;;) {
    try {
      mkdirSync(LOCK);
      break;
    } catch {
      if (existsSync(LOCK) && Date.now() - statSync(LOCK).mtimeMs > 5 * 60_000) rmdirSync(LOCK);
      if (Date.now() > deadline) throw new Error(`Another build holds ${LOCK}; remove it if no build runs.`);
      spawnSync('sleep', ['1']);
    }
  }
  try {
    return fn();
  } finally {
    rmdirSync(LOCK);
  }
}

/** Runs `ng build` (production) when stale; throws when the build fails. */
export function buildApp(options: { force?: boolean; quiet?: boolean } = {}): boolean {
  return withBuildLock(() => buildAppUnlocked(options));
}

function buildAppUnlocked(options: { force?: boolean; quiet?: boolean }): boolean {
  if (!options.force && !appIsStale()) return false;
  console.log('Building the app (ng build)…');
  const r = spawnSync(join(ROOT, 'node_modules', '.bin', 'ng'), ['build'], {
    cwd: ROOT,
    stdio: options.quiet ? 'pipe' : 'inherit',
    encoding: 'utf8',
    env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
  });
  if (r.status !== 0) throw new Error(`ng build failed${options.quiet ? `:\n${r.stdout}${r.stderr}` : '; see above.'}`);
  return true;
}
