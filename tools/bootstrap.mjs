#!/usr/bin/env node
/**
 * Launcher of `npm start`, `npm run dev` and `npm test`: `node tools/bootstrap.mjs SCRIPT.ts [ARGS]`.
 * Makes sure dependencies are installed, then runs the TypeScript script with tsx in a child
 * process that it watches over: signals are passed on, and when npm (our parent) goes away
 * without telling us — `kill <npm pid>` kills npm's shell, not us — the child is stopped too,
 * so no server or database is left behind.
 * Plain JavaScript with no dependencies, because it runs before node_modules exists.
 * Runs `npm ci` when node_modules is missing or was installed from another package-lock.json
 * (a hash of the lock file is kept in node_modules after each install).
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { spawn, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const [major, minor] = process.versions.node.split('.').map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
  console.error(`Nodewright needs Node.js 20.19 or newer; this is ${process.versions.node}.`);
  process.exit(2);
}

const lock = join(root, 'package-lock.json');
const stamp = join(root, 'node_modules', '.nodewright-lock-hash');
const lockHash = createHash('sha256').update(readFileSync(lock)).digest('hex');
const installed = existsSync(join(root, 'node_modules', '.package-lock.json'));
const current = existsSync(stamp) && readFileSync(stamp, 'utf8').trim() === lockHash;
if (!installed || !current) {
  console.log('Installing dependencies (npm ci)…');
  const r = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) {
    console.error('npm ci failed; see the messages above.');
    process.exit(r.status ?? 1);
  }
  writeFileSync(stamp, lockHash + '\n');
}

const [script, ...args] = process.argv.slice(2);
if (script) {
  const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], { cwd: root, stdio: 'inherit' });
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
    process.on(signal, () => child.kill(signal));
  }
  const parent = process.ppid;
  const watch = setInterval(() => {
    if (process.ppid !== parent) child.kill('SIGTERM');
  }, 500);
  child.on('exit', (code, signal) => {
    clearInterval(watch);
    process.exit(code ?? (signal ? 1 : 0));
  });
}
