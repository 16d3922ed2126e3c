import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { env } from './env';

// Outgoing e-mail (invitations, password resets, purchase receipts): nodemailer over plain SMTP
// to SMTP_HOST/SMTP_PORT, sent as MAIL_FROM. In development and tests the relay is the local
// maildev catcher (tests read it through tests/support/stand-ins.ts). `composeMail` builds every
// message the same way — short paragraphs and at most one link, as text and escaped HTML — so
// no caller writes markup. Callers decide whether a failed send matters (a receipt's does not).

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
}

type Holder = { mailTransport?: Transporter };
const holder = globalThis as unknown as Holder;

function transport(): Transporter {
  const e = env();
  // Plain SMTP to the configured relay (the local catcher in development and tests).
  holder.mailTransport ??= nodemailer.createTransport({ host: e.SMTP_HOST, port: e.SMTP_PORT, secure: e.SMTP_PORT === 465, ignoreTLS: e.SMTP_HOST === '127.0.0.1' });
  return holder.mailTransport;
}

export async function sendMail(message: MailMessage): Promise<void> {
  await transport().sendMail({ from: env().MAIL_FROM, ...message });
}

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A plain message body: paragraphs and one optional link, as text and as simple HTML. */
export function composeMail(paragraphs: string[], link?: { label: string; url: string }): { text: string; html: string } {
  const text = [...paragraphs, ...(link ? [`${link.label}: ${link.url}`] : []), '— Notchwise'].join('\n\n');
  const body = paragraphs.map((p) => `<p>${escape(p)}</p>`).join('');
  const button = link ? `<p><a href="${escape(link.url)}" style="color:#0F6E6E">${escape(link.label)}</a></p>` : '';
  const html = `<div style="font-family:sans-serif;color:#1F2430;line-height:1.5">${body}${button}<p style="color:#5B6170">— Notchwise</p></div>`;
  return { text, html };
}
