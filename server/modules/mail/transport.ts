// nodemailer through SMTP_URL when set, otherwise through the local development fake.
import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
}

export interface Mailer {
  kind: 'smtp' | 'fake';
  send(mail: OutgoingMail): Promise<{ messageId: string; accepted: string[] }>;
  close(): void;
}

export function createMailer(opts: { from: string; smtpUrl?: string; fake?: { host: string; port: number } }): Mailer {
  const transport = opts.smtpUrl
    ? nodemailer.createTransport(opts.smtpUrl)
    : nodemailer.createTransport({ host: opts.fake!.host, port: opts.fake!.port, secure: false, ignoreTLS: true });
  return {
    kind: opts.smtpUrl ? 'smtp' : 'fake',
    async send(mail) {
      const info = await transport.sendMail({ from: opts.from, to: mail.to, subject: mail.subject, text: mail.text });
      return { messageId: info.messageId, accepted: (info.accepted ?? []).map(String) };
    },
    close: () => transport.close(),
  };
}
