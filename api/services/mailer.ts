/**
 * Outgoing mail through nodemailer (SMTP): in development and tests the local SMTP fake
 * (tools/mail-fake.ts), in production the team's relay. A failed send never fails the write that
 * caused it: the caller learns `false` and says so; the failure is logged without credentials.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import type { SmtpConfig } from '../config';

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  /** Sends one message; true when the server accepted it. */
  send(mail: Mail): Promise<boolean>;
  close(): void;
}

/** How long a send may take before it counts as failed (the request waits for it). */
const SEND_TIMEOUT_MS = 8000;

export function createMailer(config: SmtpConfig, logger: Logger): Mailer {
  const transport: Transporter = nodemailer.createTransport({
    host: config.host,
    port: config.port,
    secure: config.secure,
    // The local fake speaks plain SMTP; a real relay on 587 upgrades with STARTTLS when offered.
    ignoreTLS: !config.secure && (config.host === '127.0.0.1' || config.host === 'localhost'),
    auth: config.user ? { user: config.user, pass: config.password ?? '' } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: SEND_TIMEOUT_MS,
  });
  return {
    async send(mail) {
      try {
        await transport.sendMail({ from: config.from, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html });
        return true;
      } catch (err) {
        logger.warn({ to: mail.to, subject: mail.subject, reason: (err as Error).message }, 'mail not sent');
        return false;
      }
    },
    close: () => transport.close(),
  };
}
