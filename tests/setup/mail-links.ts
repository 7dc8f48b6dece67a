import { inject } from 'vitest';
import type { Database } from '../../server/db/client';
import { createOutboxWorker } from '../../server/lib/mail/outbox';
import { createTransport } from '../../server/lib/mail/transport';

export const CONFIRM_SUBJECT = 'Confirm your e-mail address for Tenthmark';

interface MaildevMail {
  subject: string;
  text: string;
  to: Array<{ address: string }>;
}

/**
 * The newest mail with this subject to this address, as delivered over SMTP
 * into the test run's maildev (the app's outbox worker sends it; wait for it).
 */
export async function mailFromMaildev(to: string, subject: string, timeoutMs = 10_000): Promise<MaildevMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await fetch(`${inject('maildevUrl')}/api/email`);
    const mails = (await res.json()) as MaildevMail[];
    const mail = mails.filter((m) => m.subject === subject && m.to.some((t) => t.address === to)).at(-1);
    if (mail) return mail;
    if (Date.now() > deadline) throw new Error(`no mail "${subject}" to ${to} arrived`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** The confirmation link mailed at sign-up, as path and query (`/verify-email?token=…`), and its token. */
export async function confirmationLink(to: string): Promise<{ path: string; token: string }> {
  const mail = await mailFromMaildev(to, CONFIRM_SUBJECT);
  const match = /https?:\/\/\S+?(\/verify-email\?token=([\w-]+))/.exec(mail.text);
  if (!match) throw new Error(`the confirmation mail to ${to} has no link`);
  return { path: match[1], token: match[2] };
}

/** Sends the queued mail over SMTP into maildev, for an app that runs no mail worker of its own. */
export async function deliverQueuedMail(db: Database) {
  const transport = createTransport({ host: '127.0.0.1', port: inject('smtpPort'), secure: false });
  try {
    await createOutboxWorker({ db, transport, from: 'Tenthmark <no-reply@tenthmark.test>' }).processDue();
  } finally {
    transport.close();
  }
}
