/**
 * The `use` lines of a netlist: each library file is fetched through the caller's resolver,
 * parsed once (its problems reported at the user's `use` line) and its blocks registered, in turn
 * resolving the library files it uses itself, with cycles and runaway depth refused.
 */
import { DiagnosticBag, type SourceLoc } from '../circuit/diagnostic';
import type { BlockDef, FileUnit } from './ast';
import type { ParseOptions } from './parse-netlist';
import { parseFile } from './statements';

/** Deepest chain of library files using library files. */
const MAX_USE_DEPTH = 16;

/** Parses library files brought in by `use`, recursively, registering their blocks. */
export class UseResolver {
  readonly usedBlocks = new Map<FileUnit, Map<string, BlockDef>>();
  readonly anchors = new Map<FileUnit, SourceLoc>();
  /** Block names whose `use` failed (already reported), so their instances are not reported again. */
  readonly failedBlocks = new Set<string>();
  private readonly cache = new Map<string, FileUnit | null>();

  constructor(
    private readonly bag: DiagnosticBag,
    private readonly resolve: ParseOptions['resolveUse'],
  ) {}

  /** Resolves the uses of `file`; `anchor` is the user's `use` line for library files. */
  resolveFile(file: FileUnit, anchor: SourceLoc | undefined, stack: string[]): void {
    const blocks = new Map<string, BlockDef>();
    this.usedBlocks.set(file, blocks);
    for (const use of file.uses) {
      const key = `${use.path}@${use.version}`;
      const loc = anchor ?? use.loc;
      const prefix = file.origin ? `In \`${file.origin}\`: ` : '';
      if (stack.includes(key)) {
        this.bag.error('recursive-block', loc, `${prefix}\`${key}\` uses itself (${[...stack, key].join(' → ')}).`);
        continue;
      }
      if (stack.length >= MAX_USE_DEPTH) {
        this.bag.error('recursive-block', loc, `${prefix}Library files use each other more than ${MAX_USE_DEPTH} deep.`);
        continue;
      }
      const lib = this.load(use.path, use.version, key, loc, prefix);
      if (!lib) {
        this.failedBlocks.add(use.blockName);
        continue;
      }
      const def = lib.blocks.find((b) => b.name.text === use.blockName);
      if (!def) {
        this.failedBlocks.add(use.blockName);
        this.bag.error('unknown-use', loc, `${prefix}\`${key}\` does not define a block \`${use.blockName}\`.`);
        continue;
      }
      if (blocks.has(use.blockName) || file.blocks.some((b) => b.name.text === use.blockName)) {
        this.bag.error('duplicate-name', loc, `${prefix}A block named \`${use.blockName}\` is already defined.`, 'each block name may be defined or used once');
        continue;
      }
      blocks.set(use.blockName, def);
      if (!this.usedBlocks.has(lib)) {
        this.anchors.set(lib, loc);
        this.resolveFile(lib, loc, [...stack, key]);
      }
    }
  }

  private load(path: string, version: number, key: string, loc: SourceLoc, prefix: string): FileUnit | undefined {
    const cached = this.cache.get(key);
    if (cached !== undefined) return cached ?? undefined;
    let text: string | undefined;
    if (!this.resolve) {
      this.bag.error('unknown-use', loc, `${prefix}\`${key}\` cannot be resolved: no block library is available here.`, 'the command line reads the library from `library/` or `--lib DIR`');
      this.cache.set(key, null);
      return undefined;
    }
    try {
      const answer = this.resolve(path, version);
      if (typeof answer === 'string') text = answer;
      else if (answer && typeof answer === 'object' && answer.ok === true && typeof answer.text === 'string') text = answer.text;
      else if (answer && typeof answer === 'object' && answer.ok === false) {
        this.bag.error('unknown-use', loc, prefix + String(answer.message), answer.hint);
        this.cache.set(key, null);
        return undefined;
      }
    } catch {
      text = undefined;
    }
    if (typeof text !== 'string') {
      this.bag.error('unknown-use', loc, `${prefix}The block library has no \`${key}\`.`, 'check the path and the version number');
      this.cache.set(key, null);
      return undefined;
    }
    const libBag = new DiagnosticBag();
    const lib = parseFile(text, libBag, key);
    for (const d of libBag.items) {
      const message = `In \`${key}\` line ${d.line}: ${d.message}`;
      if (d.severity === 'error') this.bag.error(d.code, loc, prefix + message, d.hint);
      else this.bag.warning(d.code, loc, prefix + message, d.hint);
    }
    this.cache.set(key, lib);
    return lib;
  }
}
