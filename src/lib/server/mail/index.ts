/**
 * Outgoing mail. One function, `sendMail`, used by accounts, teams and comment notifications.
 * Without SMTP_URL the mail is written to the console instead, so a fresh checkout works offline.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { SMTP_URL, MAIL_FROM, PUBLIC_ORIGIN } from 'astro:env/server';

export const DEFAULT_MAIL_FROM = 'Armilla <no-reply@armilla.example>';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
}

let transport: Transporter | undefined;
let transportUrl: string | undefined;

// Public astro:env values are inlined at build time; the process environment at start-up wins so one
// build can serve under any origin (npm start and the tests set these when they launch the server).
const smtpUrl = () => process.env.SMTP_URL || SMTP_URL;
const mailFrom = () => process.env.MAIL_FROM || MAIL_FROM || DEFAULT_MAIL_FROM;

export async function sendMail({ to, subject, text, html }: MailMessage): Promise<void> {
  const url = smtpUrl();
  if (!url) {
    console.log(`[mail] SMTP_URL is not set; not sent, logged instead.\nTo: ${to}\nSubject: ${subject}\n\n${text}\n`);
    return;
  }
  if (!transport || transportUrl !== url) {
    transport = nodemailer.createTransport(url);
    transportUrl = url;
  }
  await transport.sendMail({ from: mailFrom(), to, subject, text, html });
}

/** The origin to put in links inside mails: PUBLIC_ORIGIN when set, else the origin the request came in on. */
export function linkOrigin(requestUrl: URL): string {
  const configured = process.env.PUBLIC_ORIGIN || PUBLIC_ORIGIN;
  return (configured || requestUrl.origin).replace(/\/+$/, '');
}
