// A local SMTP server for development and tests: accepts every message on loopback and hands it to
// `store` (the service keeps them in dev_mailbox). Never started when SMTP_URL names a real server.
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import type { Logger } from 'pino';
import { decodeMail, type DecodedMail } from './mime-text';

export interface ReceivedMail extends DecodedMail {
  mailFrom: string | null;
  rcptTo: string[];
  raw: string;
}

const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

export async function startSmtpFake(opts: { host: string; port: number; log: Logger; store(mail: ReceivedMail): Promise<void> }) {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: 'Afterwatch development mail fake',
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        const raw = Buffer.concat(chunks).toString('utf8');
        const mail: ReceivedMail = {
          ...decodeMail(raw),
          mailFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          rcptTo: session.envelope.rcptTo.map((r) => r.address),
          raw,
        };
        opts.store(mail).then(
          () => callback(),
          (err) => {
            opts.log.error({ err }, 'fake mailbox could not keep a message');
            callback(Object.assign(new Error('Mailbox unavailable'), { responseCode: 451 }));
          },
        );
      });
    },
  });
  await new Promise<void>((res, rej) => {
    server.once('error', rej);
    server.listen(opts.port, opts.host, () => res());
  });
  server.on('error', (err) => opts.log.warn({ err }, 'mail fake error'));
  const port = (server.server.address() as AddressInfo).port;
  opts.log.info({ port }, 'development SMTP fake listening');
  return { host: opts.host, port, close: () => new Promise<void>((res) => server.close(() => res())) };
}
