/**
 * What the server reads from a block version's source, with the solver's own parser and the
 * block doc convention (docs/netlist.md): the block named by the path's last part must be defined
 * there, and its pins and params (with their docs) are taken from it. Parsing is not solving: the
 * browser solves; the server only reads the text it stores.
 */
import { readBlockDocs } from '../../solver';
import type { DocumentedName } from '../entities';
import { HttpError } from './http-error';

export interface SourceFacts {
  title: string | null;
  summary: string | null;
  tags: string[];
  pins: DocumentedName[];
  params: DocumentedName[];
  /** Doc problems (an undocumented pin…): shown to the author and reviewer, not refused. */
  problems: string[];
}

/** The facts of the block `path` in `source`; 400 when the source does not define that block. */
export function readBlockSource(path: string, source: string): SourceFacts {
  const name = path.split('/')[1];
  const docs = readBlockDocs(source);
  const doc = docs.find((d) => d.name === name);
  if (!doc) {
    const found = docs.map((d) => `\`${d.name}\``).join(', ');
    throw new HttpError(400, 'block_not_defined', `The source must define \`block ${name}(…)\`, the last part of the path${found ? `; it defines ${found}` : ''}.`);
  }
  return {
    title: doc.title ?? null,
    summary: doc.summary ?? null,
    tags: doc.tags ?? [],
    pins: doc.pins.map((p) => ({ name: p.name, doc: p.doc ?? null })),
    params: doc.params.map((p) => ({ name: p.name, doc: p.doc ?? null, default: p.default ?? null })),
    problems: doc.problems ?? [],
  };
}
