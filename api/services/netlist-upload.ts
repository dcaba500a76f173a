/**
 * Uploading `.nwl` files: every file is checked first (name, size, UTF-8 text) and a refusal names
 * each bad file; only when all are good are they stored, in one transaction, so an upload is
 * never half stored.
 */
import type { DataSource } from 'typeorm';
import { workspaceFor } from './access';
import { audit } from './audit';
import { HttpError } from './http-error';
import { getNetlist, insertNetlist, MAX_SOURCE_BYTES, type NetlistSummary } from './netlists';

/** Files per upload. */
export const MAX_UPLOAD_FILES = 20;

export interface UploadedFile {
  originalname: string;
  size: number;
  buffer: Buffer;
}

export interface FileProblem {
  file: string;
  code: 'wrong_name' | 'too_large' | 'not_text';
  message: string;
}

const STATUS_OF: Record<FileProblem['code'], number> = { wrong_name: 415, not_text: 415, too_large: 413 };

/** The netlist's name: its `title` line, else the file name without `.nwl`. */
export function nameFromFile(fileName: string, text: string): string {
  const title = /^[ \t]*title[ \t]+(.+)$/m.exec(text)?.[1].replace(/\s+#.*$/, '').trim();
  const name = title || fileName.replace(/\.nwl$/i, '');
  return name.slice(0, 120) || 'Untitled netlist';
}

/** The text of one file, or why it is refused. */
export function readNetlistFile(f: UploadedFile): { text: string } | FileProblem {
  const file = f.originalname;
  if (!/^[^/\\]{1,200}\.nwl$/i.test(file)) return { file, code: 'wrong_name', message: `${file} is not a .nwl file; only netlists (name.nwl) can be uploaded.` };
  if (f.size > MAX_SOURCE_BYTES) return { file, code: 'too_large', message: `${file} is ${(f.size / 1024).toFixed(0)} kB; a netlist may be at most ${MAX_SOURCE_BYTES / 1024} kB.` };
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(f.buffer);
  } catch {
    return { file, code: 'not_text', message: `${file} is not UTF-8 text; it looks like a binary file.` };
  }
  if (text.includes('\u0000')) return { file, code: 'not_text', message: `${file} contains NUL bytes; it looks like a binary file.` };
  return { text: text.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n') };
}

export async function uploadNetlists(ds: DataSource, userId: string, slug: string, files: UploadedFile[]): Promise<{ items: NetlistSummary[] }> {
  await workspaceFor(ds, slug, userId, 'designer');
  if (files.length === 0) throw new HttpError(400, 'no_files', 'Choose one or more .nwl files to upload (form field "files").');
  const read = files.map(readNetlistFile);
  const problems = read.filter((r): r is FileProblem => 'code' in r);
  if (problems.length) {
    const statuses = new Set(problems.map((p) => STATUS_OF[p.code]));
    const status = statuses.size === 1 ? [...statuses][0] : 400;
    const n = problems.length;
    throw new HttpError(status, 'upload_refused', `${n} of ${files.length} file${files.length > 1 ? 's' : ''} cannot be uploaded; nothing was stored.`, problems);
  }
  const ids = await ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, userId, 'designer');
    const out: string[] = [];
    for (let i = 0; i < files.length; i++) {
      const text = (read[i] as { text: string }).text;
      const id = await insertNetlist(m, userId, ws.id, { name: nameFromFile(files[i].originalname, text), source: text });
      await audit(m, { workspaceId: ws.id, actorId: userId, action: 'netlist.upload', targetType: 'netlist', targetId: id, details: { file: files[i].originalname } });
      out.push(id);
    }
    return out;
  });
  const items: NetlistSummary[] = [];
  for (const id of ids) {
    const { source: _source, ...netlist } = await getNetlist(ds, userId, id);
    items.push(netlist);
  }
  return { items };
}
