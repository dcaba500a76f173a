/**
 * Uploading .nwl files (multer, multipart/form-data): good files become netlists; a binary,
 * oversized or wrongly named file is refused with a per-file reason, and then nothing is stored.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApi, type ApiHarness } from '../support/api-harness';
import type { TeamClient } from '../support/team-client';

let api: ApiHarness;
let ravi: TeamClient;
const tag = `u${Date.now().toString(36)}`;

beforeAll(async () => {
  api = await startApi();
  ravi = await api.signedIn('ravi@strainlab.example');
});
afterAll(async () => {
  await api?.close();
});

function form(files: [string, string | Uint8Array][]): FormData {
  const f = new FormData();
  for (const [name, content] of files) f.append('files', new File([content as BlobPart], name, { type: 'application/octet-stream' }));
  return f;
}
const upload = (f: FormData) => ravi.request('POST', '/api/workspaces/strainlab/netlists/upload', { body: f });
const count = async () => Number((await api.dataSource.query(`SELECT count(*) AS n FROM netlists WHERE name LIKE $1`, [`%${tag}%`]))[0].n);

describe('upload', () => {
  it('stores every good file as a netlist named by its title line or file name', async () => {
    const res = await upload(form([
      [`tail-${tag}.nwl`, `title Mirrored tail ${tag}\r\nvcc: vsrc(vcc, gnd) 10 V\r\n`],
      [`follower-${tag}.NWL`, '\uFEFF# no title line\n'],
    ]));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.items.map((n: { name: string; version: number }) => [n.name, n.version])).toEqual([[`Mirrored tail ${tag}`, 1], [`follower-${tag}`, 1]]);
    // Line ends normalised, the byte-order mark dropped.
    expect((await ravi.get(`/api/netlists/${res.body.items[0].id}`)).body.source).toBe(`title Mirrored tail ${tag}\nvcc: vsrc(vcc, gnd) 10 V\n`);
    expect((await ravi.get(`/api/netlists/${res.body.items[1].id}`)).body.source).toBe('# no title line\n');
  });

  it('refuses a batch with a binary and a wrongly named file (415), names each, and stores none', async () => {
    const before = await count();
    const res = await upload(form([
      [`fine-${tag}.nwl`, 'title Fine\n'],
      [`image-${tag}.nwl`, new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0xff, 0xfe, 0x00, 0x01])],
      [`notes-${tag}.txt`, 'title Notes\n'],
    ]));
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('upload_refused');
    expect(res.body.error.details).toEqual([
      { file: `image-${tag}.nwl`, code: 'not_text', message: expect.stringContaining('not UTF-8 text') },
      { file: `notes-${tag}.txt`, code: 'wrong_name', message: expect.stringContaining('not a .nwl file') },
    ]);
    expect(await count()).toBe(before);
  });

  it('answers 413 for a file over 256 kB, 415 for a binary alone, 400 for a mixed batch', async () => {
    const big = await upload(form([[`big-${tag}.nwl`, `# ${'x'.repeat(256 * 1024)}\n`]]));
    expect(big.status).toBe(413);
    expect(big.body.error.details[0].code).toBe('too_large');
    const binary = await upload(form([[`nul-${tag}.nwl`, 'title a\u0000\n']]));
    expect(binary.status).toBe(415);
    const mixed = await upload(form([[`nul-${tag}.nwl`, 'title a\u0000\n'], [`huge-${tag}.nwl`, `# ${'y'.repeat(300 * 1024)}\n`]]));
    expect([400, 413]).toContain(mixed.status);
  });

  it('answers 415 to a body that is not multipart, and 400 to an empty upload', async () => {
    const json = await ravi.post('/api/workspaces/strainlab/netlists/upload', { files: [] });
    expect(json.status).toBe(415);
    expect(json.body.error.code).toBe('not_multipart');
    const empty = await upload(new FormData());
    expect(empty.status).toBe(400);
    expect(empty.body.error.code).toBe('no_files');
  });
});
