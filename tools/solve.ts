/**
 * The command line: `npm run --silent solve -- FILE.nwl [--json] [--lib DIR]`.
 *
 * Prints the readable report (or, with --json, one §5 JSON object on stdout).
 * Exit status: 0 solved (warnings allowed), 1 the netlist has errors, 2 usage error.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { formatReport, solveNetlist } from '../solver/index';
import { createLibraryResolver, defaultLibraryDir } from './library-resolver';

const USAGE = 'usage: npm run --silent solve -- FILE.nwl [--json] [--lib DIR]';

interface Args {
  file: string;
  json: boolean;
  lib?: string;
}

function usageError(message: string): never {
  process.stderr.write(`solve: ${message}\n${USAGE}\n`);
  process.exit(2);
}

function parseArgs(argv: string[]): Args {
  let file: string | undefined;
  let json = false;
  let lib: string | undefined;
  for (let k = 0; k < argv.length; k++) {
    const a = argv[k];
    if (a === '--json') json = true;
    else if (a === '--lib') {
      lib = argv[++k];
      if (lib === undefined || lib.startsWith('--')) usageError('--lib needs a folder');
    } else if (a.startsWith('--lib=')) lib = a.slice('--lib='.length);
    else if (a === '--help' || a === '-h') {
      process.stdout.write(`${USAGE}\n`);
      process.exit(0);
    } else if (a.startsWith('-')) usageError(`unknown option ${a}`);
    else if (file !== undefined) usageError(`one netlist at a time (got ${file} and ${a})`);
    else file = a;
  }
  if (file === undefined) usageError('no netlist file given');
  return { file, json, lib };
}

function main(): void {
  const args = parseArgs(process.argv.slice(2));
  const path = resolve(args.file);
  if (!existsSync(path) || !statSync(path).isFile()) usageError(`cannot read ${args.file}: no such file`);
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    usageError(`cannot read ${args.file}: ${(err as Error).message}`);
  }
  const libDir = args.lib ? resolve(args.lib) : defaultLibraryDir();
  if (args.lib && !existsSync(libDir)) usageError(`library folder ${args.lib} does not exist`);
  const lookup = createLibraryResolver(libDir);
  const result = solveNetlist(text, { resolveUse: lookup });
  process.stdout.write(args.json ? JSON.stringify(result, null, 2) + '\n' : formatReport(result));
  process.exitCode = result.errors.length > 0 ? 1 : 0;
}

main();
