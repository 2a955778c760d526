// E-mail: the transport (a real server through SMTP_URL, else the local fake), alert mails to the
// depot's subscribers, and the weekly digest to planners on a schedule and on demand.
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Logger } from 'pino';
import type { Config } from '../../config';
import type { AlertView } from '../../../shared/realtime/envelope';
import { startSmtpFake } from '../../dev-fakes/smtp-fake';
import { composeAlertMail, type MailReason } from './compose';
import { buildDigest, digestSlot, plannerEmails } from './digest';
import { keepFakeMail } from './mailbox';
import { subscribersOf } from './subscriptions';
import { createMailer } from './transport';

const MAILED_ON_RAISE: AlertView['kind'][] = ['interruptedPurge', 'undeterminedCold', 'forecastFreeze'];
const FAKE_HOST = '127.0.0.1';

export function mailReason(alert: AlertView): MailReason | null {
  if (alert.status !== 'open') return null;
  if (alert.escalatedAt) return 'escalated';
  return MAILED_ON_RAISE.includes(alert.kind) ? 'raised' : null;
}

export async function startMail(deps: { config: Config; sequelize: Sequelize; log: Logger; now?: () => number }) {
  const { config, sequelize, log } = deps;
  const now = () => new Date((deps.now ?? Date.now)());
  const fake = config.SMTP_URL ? null : await startSmtpFake({ host: FAKE_HOST, port: config.SMTP_FAKE_PORT, log, store: (m) => keepFakeMail(sequelize, m) });
  const mailer = createMailer({ from: config.MAIL_FROM, smtpUrl: config.SMTP_URL, fake: fake ?? undefined });
  let chain = Promise.resolve();

  async function mailAlert(alert: AlertView) {
    const reason = mailReason(alert);
    if (!reason) return;
    const to = await subscribersOf(sequelize, alert.depot);
    // Claim the (alert, reason) pair first: the same alert is published again on every change.
    const claimed = await sequelize.query('INSERT INTO alert_mails (alert_id, reason, recipients) VALUES ($1, $2, $3) ON CONFLICT DO NOTHING RETURNING alert_id', {
      bind: [alert.id, reason, to], type: QueryTypes.SELECT,
    });
    if (!claimed.length || !to.length) return;
    try {
      await mailer.send({ to, ...composeAlertMail(alert, reason) });
    } catch (err) {
      await sequelize.query('DELETE FROM alert_mails WHERE alert_id = $1 AND reason = $2', { bind: [alert.id, reason] });
      throw err;
    }
  }

  async function sendDigest(slot: string | null) {
    const to = await plannerEmails(sequelize);
    if (slot) {
      const claimed = await sequelize.query('INSERT INTO digest_runs (slot, recipients) VALUES ($1, $2) ON CONFLICT DO NOTHING RETURNING id', { bind: [slot, to], type: QueryTypes.SELECT });
      if (!claimed.length) return null;
    } else await sequelize.query('INSERT INTO digest_runs (slot, recipients) VALUES (NULL, $1)', { bind: [to] });
    const digest = await buildDigest(sequelize, now());
    if (to.length) await mailer.send({ to, ...digest });
    return { recipients: to, subject: digest.subject };
  }

  const schedule = setInterval(() => {
    const slot = digestSlot(now(), config.DIGEST_WEEKDAY, config.DIGEST_HOUR_UTC);
    if (slot) sendDigest(slot).catch((err) => log.warn({ err }, 'weekly digest not sent'));
  }, 10 * 60_000);
  schedule.unref();

  return {
    transport: mailer.kind,
    fakePort: fake?.port ?? null,
    onAlert(alert: AlertView) {
      chain = chain.then(() => mailAlert(alert).catch((err) => log.warn({ err, alertId: alert.id }, 'alert mail not sent')));
    },
    idle: () => chain,
    sendDigest,
    async close() {
      clearInterval(schedule);
      await chain;
      mailer.close();
      await fake?.close();
    },
  };
}

export type MailService = Awaited<ReturnType<typeof startMail>>;
