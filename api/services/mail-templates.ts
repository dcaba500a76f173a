/**
 * The words of our mails: plain text and HTML with the same content and absolute links.
 */
import type { Mail } from './mailer';

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ESCAPES[c]);
}

function html(paragraphs: string[], link: { href: string; label: string }, footer: string): string {
  return `<!doctype html><html><body style="font-family: 'Source Sans 3', Arial, sans-serif; color: #1d2230; background: #f7f3ea; padding: 16px">
<div style="max-width: 560px; background: #fffdf8; border: 1px solid #d8d0bf; border-radius: 8px; padding: 20px">
${paragraphs.map((p) => `<p style="margin: 0 0 12px">${p}</p>`).join('\n')}
<p style="margin: 18px 0"><a href="${escapeHtml(link.href)}" style="background: #963f1a; color: #ffffff; padding: 8px 14px; border-radius: 6px; text-decoration: none">${escapeHtml(link.label)}</a></p>
<p style="margin: 0 0 12px; font-size: 13px; color: #444a58">Or paste this address into your browser: ${escapeHtml(link.href)}</p>
<p style="margin: 16px 0 0; font-size: 13px; color: #444a58">${escapeHtml(footer)}</p>
</div></body></html>`;
}

export function invitationMail(p: { to: string; inviter: string; workspace: string; role: string; url: string; expiresAt: Date }): Mail {
  const expires = p.expiresAt.toUTCString();
  const footer = 'Nodewright, the analog front-end bench. If you did not expect this invitation, ignore this mail.';
  return {
    to: p.to,
    subject: `${p.inviter} invites you to ${p.workspace} on Nodewright`,
    text: [
      `${p.inviter} invites you to join ${p.workspace} on Nodewright as ${p.role}.`,
      '',
      `Accept by signing in with this address (${p.to}):`,
      p.url,
      '',
      `The link works once and expires on ${expires}.`,
      '',
      footer,
    ].join('\n'),
    html: html(
      [
        `<strong>${escapeHtml(p.inviter)}</strong> invites you to join <strong>${escapeHtml(p.workspace)}</strong> on Nodewright as <strong>${escapeHtml(p.role)}</strong>.`,
        `Accept by signing in with this address (${escapeHtml(p.to)}). The link works once and expires on ${escapeHtml(expires)}.`,
      ],
      { href: p.url, label: 'Join the team' },
      footer,
    ),
  };
}

export function sharedMail(p: { to: string; sharer: string; netlist: string; version: number; workspace: string; url: string; expiresAt: Date | null }): Mail {
  const expiry = p.expiresAt ? `The link expires on ${p.expiresAt.toUTCString()}.` : 'The link does not expire unless it is revoked.';
  const footer = 'Nodewright uses first-order device models: its figures are for sanity-checking topologies and do not replace sign-off simulation.';
  return {
    to: p.to,
    subject: `${p.sharer} shared “${p.netlist}” with you`,
    text: [
      `${p.sharer} shared the netlist “${p.netlist}” (version ${p.version}, ${p.workspace}) with you.`,
      '',
      'Open it read-only in your browser; it solves there, no sign-in needed:',
      p.url,
      '',
      expiry,
      '',
      footer,
    ].join('\n'),
    html: html(
      [
        `<strong>${escapeHtml(p.sharer)}</strong> shared the netlist <strong>“${escapeHtml(p.netlist)}”</strong> (version ${p.version}, ${escapeHtml(p.workspace)}) with you.`,
        `It opens read-only and solves in your browser; no sign-in is needed. ${escapeHtml(expiry)}`,
      ],
      { href: p.url, label: 'Open the netlist' },
      footer,
    ),
  };
}

export function reviewRequestMail(p: { to: string; author: string; path: string; version: number; title: string; workspace: string; url: string }): Mail {
  const footer = 'Nodewright block library. Re-solve its checks on the block page before you vet it.';
  return {
    to: p.to,
    subject: `Review requested: ${p.path}@${p.version} (${p.title})`,
    text: [
      `${p.author} submitted version ${p.version} of the block ${p.path} (“${p.title}”) in ${p.workspace} for review.`,
      '',
      'Open it, re-solve its checks in your browser, and vet it or send it back:',
      p.url,
      '',
      footer,
    ].join('\n'),
    html: html(
      [`<strong>${escapeHtml(p.author)}</strong> submitted version ${p.version} of the block <strong>${escapeHtml(p.path)}</strong> (“${escapeHtml(p.title)}”) in ${escapeHtml(p.workspace)} for review.`, 'Open it, re-solve its checks in your browser, and vet it or send it back.'],
      { href: p.url, label: 'Review the block' },
      footer,
    ),
  };
}

export function reviewDecisionMail(p: { to: string; reviewer: string; path: string; version: number; decision: 'approve' | 'send_back'; comment: string; url: string }): Mail {
  const verdict = p.decision === 'approve' ? 'vetted' : 'sent back';
  const footer = p.decision === 'approve' ? 'Netlists can now pin it with `use ' + `${p.path}@${p.version}` + '`.' : 'Read the comments, then propose a new version.';
  return {
    to: p.to,
    subject: `${p.path}@${p.version} was ${verdict} by ${p.reviewer}`,
    text: [`${p.reviewer} ${verdict} version ${p.version} of ${p.path}.`, ...(p.comment ? ['', `“${p.comment}”`] : []), '', p.url, '', footer].join('\n'),
    html: html(
      [`<strong>${escapeHtml(p.reviewer)}</strong> ${verdict} version ${p.version} of <strong>${escapeHtml(p.path)}</strong>.`, ...(p.comment ? [`“${escapeHtml(p.comment)}”`] : [])],
      { href: p.url, label: 'Open the block' },
      footer,
    ),
  };
}
