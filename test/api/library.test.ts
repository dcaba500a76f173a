/**
 * The team block library on the real PostgreSQL over real HTTP: proposing blocks and versions,
 * the review state machine (every illegal transition refused with a clear code), versions frozen
 * once submitted (by the service and by the database itself), the review mails with working
 * links, the review queue, resolving `use`, the catalogue and its filters, and the seed library.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApi, type ApiHarness } from '../support/api-harness';
import type { TeamClient } from '../support/team-client';

let api: ApiHarness;
let ravi: TeamClient; // designer
let mei: TeamClient; // reviewer
let ada: TeamClient; // admin
let sam: TeamClient; // viewer
const tag = `t${Date.now().toString(36)}`;
const category = `lab_${tag}`;

beforeAll(async () => {
  api = await startApi();
  [ravi, mei, ada, sam] = await Promise.all(['ravi', 'mei', 'ada', 'sam'].map((n) => api.signedIn(`${n}@strainlab.example`)));
});
afterAll(async () => {
  await api?.close();
});

/** A two-transistor mirror named `name`, with a fixture and one check. */
function mirror(name: string, extra = ''): string {
  return `#: Two-transistor test mirror ${name}
#: pin in — reference current in
#: pin out — mirrored current in
#: pin rail — emitters
model qm: npn(is=1e-16, beta=100, va=80)
block ${name}(in, out, rail)
  qa: npn(c=in, b=in, e=rail) qm
  qb: npn(c=out, b=in, e=rail) qm
end
vcc: vsrc(vcc, gnd) 5
iref: isrc(vcc, ref) 100u
m1: ${name}(in=ref, out=o, rail=gnd)
vo: vsrc(o, gnd) 2.5
check -i(vo) / 100u = 0.98 ± 0.05
${extra}`;
}
const CHECKS = [{ line: 15, text: '-i(vo) / 100u = 0.98 ± 0.05', pass: true, value: 0.979 }];
const blockUrl = (name: string) => `/api/workspaces/strainlab/blocks/${category}/${name}`;

async function propose(c: TeamClient, name: string): Promise<void> {
  const res = await c.post('/api/workspaces/strainlab/blocks', { path: `${category}/${name}`, source: mirror(name), tags: ['npn', tag] });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
}

describe('proposing', () => {
  it('creates version 1 as the author’s draft, with pins and params read from the source', async () => {
    const res = await ravi.post('/api/workspaces/strainlab/blocks', { path: `${category}/first`, source: mirror('first'), tags: ['npn', tag] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ path: `${category}/first`, version: 1, state: 'draft', author: { email: 'ravi@strainlab.example' }, can: { edit: true, submit: true, review: false, retire: false } });
    expect(res.body.pins.map((p: { name: string }) => p.name)).toEqual(['in', 'out', 'rail']);
    expect(res.body.pins[0].doc).toMatch(/reference current/);
  });

  it('refuses a source that does not define the block of the path, a taken path, and a viewer', async () => {
    const wrong = await ravi.post('/api/workspaces/strainlab/blocks', { path: `${category}/other`, source: mirror('first') });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.code).toBe('block_not_defined');
    const taken = await ravi.post('/api/workspaces/strainlab/blocks', { path: `${category}/first`, source: mirror('first') });
    expect(taken.body.error.code).toBe('block_exists');
    expect((await sam.post('/api/workspaces/strainlab/blocks', { path: `${category}/sams`, source: mirror('sams') })).status).toBe(403);
    expect((await ravi.post('/api/workspaces/strainlab/blocks', { path: 'No/Caps', source: mirror('caps') })).status).toBe(400);
  });

  it('lets only the author edit a draft', async () => {
    await propose(ravi, 'edited');
    const edited = await ravi.put(`${blockUrl('edited')}/versions/1`, { source: mirror('edited', '# a note\n') });
    expect(edited.status).toBe(200);
    expect(edited.body.source).toContain('# a note');
    expect((await mei.put(`${blockUrl('edited')}/versions/1`, { source: mirror('edited') })).status).toBe(403);
  });
});

describe('the review state machine', () => {
  it('submits with the author’s checks, mails the reviewers a working link, and queues it', async () => {
    await propose(ravi, 'reviewed');
    expect((await mei.post(`${blockUrl('reviewed')}/versions/1/submit`, { checks: CHECKS })).status).toBe(403);
    const sub = await ravi.post(`${blockUrl('reviewed')}/versions/1/submit`, { checks: CHECKS, note: 'Ratio within 2 %.' });
    expect(sub.status, JSON.stringify(sub.body)).toBe(200);
    expect(sub.body).toMatchObject({ state: 'in_review', checks: CHECKS, can: { edit: false, submit: false } });
    expect(sub.body.mailed).toEqual(expect.arrayContaining(['mei@strainlab.example', 'ada@strainlab.example']));
    const [mail] = await api.mailTo('mei@strainlab.example');
    expect(mail.subject).toBe(`Review requested: ${category}/reviewed@1 (Two-transistor test mirror reviewed)`);
    const link = `${api.url}/w/strainlab/library/${category}/reviewed/1`;
    expect(mail.text).toContain(link);
    expect(mail.html).toContain(`href="${link}"`);
    const queue = await mei.get('/api/workspaces/strainlab/review-queue');
    expect(queue.body.items.find((i: { path: string }) => i.path === `${category}/reviewed`)).toMatchObject({ version: 1, checks: { total: 1, failing: 0 } });
    expect((await ravi.get('/api/workspaces/strainlab/review-queue')).status).toBe(403);
  });

  it('freezes a submitted version: no edit through the API, nor by UPDATE in SQL', async () => {
    const frozen = await ravi.put(`${blockUrl('reviewed')}/versions/1`, { source: mirror('reviewed', '# sneaky\n') });
    expect(frozen.status).toBe(409);
    expect(frozen.body.error.code).toBe('version_frozen');
    await expect(api.dataSource.query(
      `UPDATE block_versions SET source = 'forged' WHERE block_id = (SELECT id FROM blocks WHERE path = $1)`, [`${category}/reviewed`],
    )).rejects.toThrow(/never change/);
    await expect(api.dataSource.query(
      `UPDATE block_versions SET state = 'retired' WHERE block_id = (SELECT id FROM blocks WHERE path = $1)`, [`${category}/reviewed`],
    )).rejects.toThrow(/cannot go from in_review to retired/);
  });

  it('is vetted by a reviewer who is not the author, who mails the decision; then only an admin retires it', async () => {
    expect((await ravi.post(`${blockUrl('reviewed')}/versions/1/review`, { decision: 'approve' })).status).toBe(403);
    const ok = await mei.post(`${blockUrl('reviewed')}/versions/1/review`, { decision: 'approve', comment: 'Checks re-solved: same figures.' });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ state: 'vetted', decidedBy: { email: 'mei@strainlab.example' } });
    const [mail] = await api.mailTo('ravi@strainlab.example');
    expect(mail.subject).toBe(`${category}/reviewed@1 was vetted by Mei Tanaka`);
    expect(mail.text).toContain(`${api.url}/w/strainlab/library/${category}/reviewed/1`);

    const again = await mei.post(`${blockUrl('reviewed')}/versions/1/review`, { decision: 'approve' });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'illegal_transition', message: expect.stringContaining('is vetted') });
    expect((await ravi.post(`${blockUrl('reviewed')}/versions/1/submit`, { checks: [] })).body.error.code).toBe('illegal_transition');
    expect((await mei.post(`${blockUrl('reviewed')}/versions/1/retire`)).status).toBe(403);
    const retired = await ada.post(`${blockUrl('reviewed')}/versions/1/retire`);
    expect(retired.body.state).toBe('retired');
    expect((await ada.post(`${blockUrl('reviewed')}/versions/1/retire`)).body.error.code).toBe('illegal_transition');
  });

  it('sends back to draft only with a reason, keeps line comments in the thread, and takes a resubmission unchanged', async () => {
    await propose(ravi, 'returned');
    await ravi.post(`${blockUrl('returned')}/versions/1/submit`, { checks: CHECKS });
    const bare = await mei.post(`${blockUrl('returned')}/versions/1/review`, { decision: 'send_back' });
    expect(bare.body.error.code).toBe('reason_required');
    const back = await mei.post(`${blockUrl('returned')}/versions/1/review`, { decision: 'send_back', comment: 'Document the headroom.', comments: [{ line: 8, text: 'qb needs a VCE check' }] });
    expect(back.body.state).toBe('draft');
    expect(back.body.reviews.map((r: { kind: string; line: number | null }) => [r.kind, r.line])).toEqual([['submit', null], ['comment', 8], ['send_back', null]]);
    // Submitted once, so frozen: the author resubmits as is, or proposes version 2.
    expect((await ravi.put(`${blockUrl('returned')}/versions/1`, { source: mirror('returned') })).body.error.code).toBe('version_frozen');
    const v2 = await ravi.post(`${blockUrl('returned')}/versions`, { source: mirror('returned', '# headroom documented\n') });
    expect(v2.status).toBe(201);
    expect(v2.body).toMatchObject({ version: 2, state: 'draft' });
    const resub = await ravi.post(`${blockUrl('returned')}/versions/1/submit`, { checks: [] });
    expect(resub.body).toMatchObject({ state: 'in_review', checks: CHECKS });
  });

  it('never lets reviewers vet their own version', async () => {
    await propose(mei, 'meis');
    await mei.post(`${blockUrl('meis')}/versions/1/submit`, { checks: CHECKS });
    expect((await mei.post(`${blockUrl('meis')}/versions/1/review`, { decision: 'approve' })).status).toBe(403);
    expect((await mei.get('/api/workspaces/strainlab/review-queue')).body.items.some((i: { path: string }) => i.path === `${category}/meis`)).toBe(false);
    expect((await ada.post(`${blockUrl('meis')}/versions/1/review`, { decision: 'approve' })).body.state).toBe('vetted');
  });

  it('audits every transition', async () => {
    const log = await ada.get('/api/workspaces/strainlab/audit?pageSize=100');
    const actions = log.body.items.filter((e: { details: { path?: string } | null }) => e.details?.path === `${category}/reviewed`).map((e: { action: string }) => e.action);
    expect(actions).toEqual(['block.retire', 'block.approve', 'block.submit', 'block.create']);
  });
});

describe('using and finding blocks', () => {
  it('resolves a vetted version for everyone, a draft for its author and reviewers only', async () => {
    const vetted = await sam.get(`/api/workspaces/strainlab/library/${category}/meis/1`);
    expect(vetted.status).toBe(200);
    expect(vetted.body).toMatchObject({ state: 'vetted', newestVetted: 1, source: expect.stringContaining(`block meis(`) });
    await propose(ravi, 'drafty');
    expect((await ravi.get(`/api/workspaces/strainlab/library/${category}/drafty/1`)).status).toBe(200);
    expect((await mei.get(`/api/workspaces/strainlab/library/${category}/drafty/1`)).status).toBe(200);
    expect((await sam.get(`/api/workspaces/strainlab/library/${category}/drafty/1`)).status).toBe(404);
  });

  it('filters the catalogue by text, category, state and tag', async () => {
    const byCategory = await sam.get(`/api/workspaces/strainlab/blocks?category=${category}`);
    expect(byCategory.body.items.map((b: { path: string }) => b.path)).toEqual(
      ['drafty', 'edited', 'first', 'meis', 'returned', 'reviewed'].map((n) => `${category}/${n}`),
    );
    const vetted = await sam.get(`/api/workspaces/strainlab/blocks?category=${category}&state=vetted`);
    expect(vetted.body.items.map((b: { path: string }) => b.path)).toEqual([`${category}/meis`]);
    const text = await sam.get(`/api/workspaces/strainlab/blocks?q=${category}/ret`);
    expect(text.body.items.map((b: { path: string }) => b.path)).toEqual([`${category}/returned`]);
    const tagged = await sam.get(`/api/workspaces/strainlab/blocks?tag=${tag}`);
    expect(tagged.body.total).toBe(6);
    expect((await api.stack.api!.dataSource.query(`SELECT 1`)).length).toBe(1);
  });

  it('has the seed library loaded as vetted versions of the demo workspace', async () => {
    const seeds = await sam.get('/api/workspaces/strainlab/blocks?category=mirrors&state=vetted');
    const wilson = seeds.body.items.find((b: { path: string }) => b.path === 'mirrors/wilson_npn');
    expect(wilson).toMatchObject({ vetted: 3, latest: { version: 3, state: 'vetted' } });
    const v3 = await sam.get('/api/workspaces/strainlab/blocks/mirrors/wilson_npn/versions/3');
    expect(v3.body.checks.length).toBeGreaterThan(0);
    expect(v3.body.checks.every((c: { pass: boolean }) => c.pass)).toBe(true);
    expect((await api.client().get('/api/workspaces/strainlab/blocks')).status).toBe(401);
  });
});
