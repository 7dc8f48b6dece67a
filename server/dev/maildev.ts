import { MailDev } from 'maildev';

/** maildev on loopback only: an SMTP server that keeps mail, and a web inbox with a REST API. */
export async function startMaildev(options: { smtpPort: number; webPort: number }) {
  const maildev = new MailDev({
    smtp: options.smtpPort,
    ip: '127.0.0.1',
    web: options.webPort,
    webIp: '127.0.0.1',
    silent: true,
  } as ConstructorParameters<typeof MailDev>[0]);
  await maildev.start();
  return {
    smtpPort: options.smtpPort,
    webUrl: `http://127.0.0.1:${options.webPort}`,
    stop: () => maildev.stop(),
  };
}
