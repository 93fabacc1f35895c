/**
 * Outgoing mail through nodemailer. In development and tests the SMTP server is the
 * local fake one (src/lib/server/mailbox.ts); in production point SMTP_HOST/SMTP_PORT
 * at a real relay.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from './config';

let transport: Transporter | undefined;

function transporter(): Transporter {
  transport ??= nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    secure: false,
    ignoreTLS: config.LOFTWISE_ENV !== 'production',
    connectionTimeout: 5_000
  });
  return transport;
}

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Extra headers, e.g. the workspace a message belongs to (read back by the outbox). */
  headers?: Record<string, string>;
}

export async function sendMail(mail: Mail) {
  return transporter().sendMail({ from: config.MAIL_FROM, ...mail });
}
