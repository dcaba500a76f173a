import { createTransport } from 'nodemailer';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startMailFake, type MailMessage, type RunningMailFake } from '../../tools/mail-fake';

// Real SMTP from nodemailer into the fake, real HTTP out of its inbox.
let fake: RunningMailFake;
beforeAll(async () => {
  fake = await startMailFake({ smtpPort: 0, httpPort: 0 });
});
afterAll(async () => {
  await fake?.close();
});
beforeEach(() => fake.clear());

const SUBJECT = 'Einladung — Ωmega team ✓ <bias & mirrors>';
const LINK = 'http://127.0.0.1:4200/join/abc123?x=1&y=2';

function send(extra: Record<string, unknown> = {}) {
  const transport = createTransport({ host: fake.host, port: fake.smtpPort, secure: false, ignoreTLS: true });
  return transport.sendMail({
    from: '"Nodewright – Team" <team@nodewright.test>',
    to: 'Ada.Designer@Example.test',
    bcc: 'audit@example.test',
    subject: SUBJECT,
    text: `Grüße! Join the Ωmega workspace:\n${LINK}\n`,
    html: `<p>Grüße! <a href="${LINK.replace(/&/g, '&amp;')}">Join the Ωmega workspace</a></p>`,
    ...extra,
  });
}

describe('mail fake', () => {
  it('reports the real ports it listens on', () => {
    expect(fake.smtpPort).toBeGreaterThan(0);
    expect(fake.inboxUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
    expect(fake.inboxUrl).not.toContain(':0/');
  });

  it('keeps a message sent over SMTP, decoded', async () => {
    const info = await send();
    // nodemailer lower-cases the domain part of addresses.
    expect(info.accepted).toEqual(['Ada.Designer@example.test', 'audit@example.test']);
    const [m] = fake.messages();
    expect(fake.messages()).toHaveLength(1);
    expect(m.subject).toBe(SUBJECT);
    expect(m.from).toBe('Nodewright – Team <team@nodewright.test>');
    expect(m.to).toEqual(['Ada.Designer@example.test', 'audit@example.test']);
    expect(m.text).toBe(`Grüße! Join the Ωmega workspace:\n${LINK}\n`);
    expect(m.html).toContain(`href="${LINK.replace(/&/g, '&amp;')}"`);
    expect(m.html).toContain('Grüße!');
    expect(m.raw).toContain('Content-Type: multipart/alternative');
    expect(Date.parse(m.receivedAt)).not.toBeNaN();
  });

  it('decodes base64 bodies, long folded subjects and text-only mail', async () => {
    const long = `${'Ωmega ✓ '.repeat(20)}end`;
    await send({ subject: long, text: 'ä'.repeat(300), html: undefined, textEncoding: 'base64' });
    const [m] = fake.messages();
    expect(m.raw).toMatch(/Content-Transfer-Encoding: base64/i);
    expect(m.subject).toBe(long);
    expect(m.text).toBe('ä'.repeat(300));
    expect(m.html).toBeNull();
  });

  it('serves the messages as JSON, newest first, filtered by recipient', async () => {
    await send({ subject: 'first' });
    await send({ subject: 'second', to: 'someone@else.test', bcc: undefined });
    const all = (await (await fetch(`${fake.inboxUrl}api/messages`)).json()) as { items: MailMessage[] };
    expect(all.items.map((m) => m.subject)).toEqual(['second', 'first']);

    const res = await fetch(`${fake.inboxUrl}api/messages?to=${encodeURIComponent('ada.designer@example.TEST')}`);
    expect(res.headers.get('content-type')).toMatch(/^application\/json/);
    const { items } = (await res.json()) as { items: MailMessage[] };
    expect(items.map((m) => m.subject)).toEqual(['first']);
    expect(items[0].text).toContain(LINK);

    const one = await fetch(`${fake.inboxUrl}api/messages/${items[0].id}`);
    expect(((await one.json()) as MailMessage).subject).toBe('first');
  });

  it('lists the subject escaped on the inbox page and shows a message with its HTML sandboxed', async () => {
    await send();
    const inbox = await fetch(fake.inboxUrl);
    expect(inbox.status).toBe(200);
    expect(inbox.headers.get('content-security-policy')).toContain("default-src 'none'");
    const page = await inbox.text();
    expect(page).toContain('Einladung — Ωmega team ✓ &#60;bias &#38; mirrors&#62;');
    expect(page).not.toContain('<bias');

    const id = fake.messages()[0].id;
    expect(page).toContain(`href="/messages/${id}"`);
    const detail = await (await fetch(`${fake.inboxUrl}messages/${id}`)).text();
    expect(detail).toContain('<iframe title="HTML part" sandbox=');
    expect(detail).toMatch(/srcdoc="[^"]*&#60;a href=&#34;/);
    expect(detail).toContain(`<a href="http://127.0.0.1:4200/join/abc123?x=1&#38;y=2">`);
  });

  it('clears with DELETE /api/messages', async () => {
    await send();
    const res = await fetch(`${fake.inboxUrl}api/messages`, { method: 'DELETE' });
    expect(res.status).toBe(204);
    expect(fake.messages()).toEqual([]);
    expect((await fetch(`${fake.inboxUrl}messages/nope`)).status).toBe(404);
  });

  it('refuses a message over 5 MB', async () => {
    await expect(send({ text: 'x'.repeat(6 * 1024 * 1024) })).rejects.toThrow(/552|size/i);
    expect(fake.messages()).toEqual([]);
  });
});
