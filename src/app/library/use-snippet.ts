/**
 * What "Use in my netlist" copies: the `use` line pinning the version, and an instance line with
 * every pin named and waiting for a node (docs/netlist.md §3, "use: blocks from the library").
 */
import type { DocumentedName } from './library-api';

/** Stands for the node the designer still has to write. */
export const TO_FILL = '…';

/** `use mirrors/wilson_npn@3`. */
export function useLine(path: string, version: number): string {
  return `use ${path}@${version}`;
}

/** The block's name: the last part of its path. */
export function blockName(path: string): string {
  return path.slice(path.lastIndexOf('/') + 1);
}

/**
 * `x1: wilson_npn(in=…, out=…, rail=…)`, with the params and their defaults in a trailing
 * comment (written out, a default that refers to the block's own params would not mean the same
 * at the point of use, so they are only listed).
 */
export function instanceLine(path: string, pins: readonly DocumentedName[], params: readonly DocumentedName[] = [], instance = 'x1'): string {
  const connections = pins.map((p) => `${p.name}=${TO_FILL}`).join(', ');
  const line = `${instance}: ${blockName(path)}(${connections})`;
  if (params.length === 0) return line;
  const listed = params.map((p) => (p.default ? `${p.name}=${p.default}` : p.name)).join(' ');
  return `${line}  # params: ${listed}`;
}

/** Both lines, ready for the clipboard. */
export function useSnippet(path: string, version: number, pins: readonly DocumentedName[], params: readonly DocumentedName[] = []): string {
  return `${useLine(path, version)}\n${instanceLine(path, pins, params)}\n`;
}
