import nodemailer from 'nodemailer';
import type { AppConfig } from '../../env';

export function createTransport(smtp: AppConfig['smtp']) {
  return nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: smtp.secure,
    // A local relay (maildev) speaks plain SMTP; a real relay negotiates TLS.
    ignoreTLS: !smtp.secure && (smtp.host === '127.0.0.1' || smtp.host === 'localhost'),
    auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 10_000,
  });
}
