// The development mailbox: what the SMTP fake received.
import { QueryTypes, type Sequelize } from 'sequelize';
import { notFound } from '../../lib/errors';
import type { ReceivedMail } from '../../dev-fakes/smtp-fake';

export async function keepFakeMail(sequelize: Sequelize, m: ReceivedMail) {
  await sequelize.query(`INSERT INTO dev_mailbox (mail_from, rcpt_to, subject, text_body, raw) VALUES ($1, $2, $3, $4, $5)`, {
    bind: [m.mailFrom, m.rcptTo, m.subject, m.text, m.raw],
  });
}

interface Row { id: string; received_at: Date; mail_from: string | null; rcpt_to: string[]; subject: string; text_body: string }
const present = (r: Row) => ({ id: Number(r.id), receivedAt: r.received_at.toISOString(), from: r.mail_from, to: r.rcpt_to, subject: r.subject, text: r.text_body });

export async function listMailbox(sequelize: Sequelize, limit: number) {
  const rows = await sequelize.query<Row>('SELECT id, received_at, mail_from, rcpt_to, subject, text_body FROM dev_mailbox ORDER BY id DESC LIMIT $1', { bind: [limit], type: QueryTypes.SELECT });
  return rows.map(present);
}

export async function getMail(sequelize: Sequelize, id: number) {
  const [r] = await sequelize.query<Row>('SELECT id, received_at, mail_from, rcpt_to, subject, text_body FROM dev_mailbox WHERE id = $1', { bind: [id], type: QueryTypes.SELECT });
  if (!r) throw notFound(`Message ${id}`);
  return present(r);
}
