// E-mail through the real SMTP fake (smtp-server) and nodemailer: alert mails to a depot's subscribers,
// escalations, the weekly digest, and a real SMTP server taking over when SMTP_URL is set.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { SMTPServer } from 'smtp-server';
import type { AddressInfo } from 'node:net';
import { startTestService, type TestService } from '../../helpers/service';
import { addUser, interruptedUnit, until } from './helpers';

let t: TestService;
let admin: string;
let planner: Awaited<ReturnType<typeof addUser>>;
let tech: Awaited<ReturnType<typeof addUser>>;
const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
type Mail = { id: number; to: string[]; subject: string; text: string; from: string | null };
const mailbox = async () => (await t.api.get('/api/mail/mailbox').set(auth(admin))).body as Mail[];

beforeAll(async () => {
  // Escalation after 2.4 s so that the escalated mail comes within the test.
  t = await startTestService({ ALERT_ESCALATE_MINUTES: '0.04', MAIL_FROM: 'Afterwatch test <desk@test.local>' });
  admin = await t.token();
  planner = await addUser(t, admin, 'planner');
  tech = await addUser(t, admin, 'technician');
});
afterAll(async () => t?.stop());

describe('e-mail', () => {
  it('the fake keeps a real message sent by nodemailer, decoded: subject, recipients and body', async () => {
    const status = await t.api.get('/api/mail/status').set(auth(admin));
    expect(status.body.transport).toBe('fake');
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: status.body.fakePort, secure: false, ignoreTLS: true });
    await transport.sendMail({ from: 'probe@test.local', to: ['a@test.local', 'b@test.local'], subject: 'Ambient −14 °C at the yard', text: 'Line one\nZweite Zeile: Größe ≤ 8 MB\n' + 'x'.repeat(120) });
    transport.close();
    const got = await until(async () => (await mailbox()).find((m) => m.subject === 'Ambient −14 °C at the yard'));
    expect(got.to).toEqual(['a@test.local', 'b@test.local']);
    expect(got.from).toBe('probe@test.local');
    expect(got.text).toBe('Line one\nZweite Zeile: Größe ≤ 8 MB\n' + 'x'.repeat(120));
    const one = await t.api.get(`/api/mail/mailbox/${got.id}`).set(auth(admin));
    expect(one.body.subject).toBe(got.subject);
    expect((await t.api.get('/api/mail/mailbox').set(auth(planner.token))).status).toBe(403);
  });

  it('subscriptions: each user may subscribe themselves, only admins anyone', async () => {
    expect((await t.api.post('/api/mail/subscriptions').set(auth(tech.token)).send({ depot: 'Frost yard' })).status).toBe(201);
    expect((await t.api.post('/api/mail/subscriptions').set(auth(tech.token)).send({ depot: 'Frost yard', userId: planner.id })).status).toBe(403);
    expect((await t.api.post('/api/mail/subscriptions').set(auth(admin)).send({ depot: 'Frost yard', userId: planner.id })).status).toBe(201);
    expect((await t.api.post('/api/mail/subscriptions').set(auth(admin)).send({ depot: 'Other yard', userId: planner.id })).status).toBe(201);
    const mine = await t.api.get('/api/mail/subscriptions').set(auth(tech.token));
    expect(mine.body).toEqual([{ userId: tech.id, email: tech.email, name: 'The technician', depot: 'Frost yard' }]);
    const all = await t.api.get('/api/mail/subscriptions').set(auth(admin));
    expect(all.body.map((s: { email: string; depot: string }) => `${s.depot}/${s.email}`)).toEqual(['Frost yard/planner@test.local', 'Frost yard/technician@test.local', 'Other yard/planner@test.local']);
    expect((await t.api.delete('/api/mail/subscriptions?depot=Other%20yard').set(auth(tech.token))).status).toBe(204);
    expect((await t.api.delete(`/api/mail/subscriptions?depot=Other%20yard&userId=${planner.id}`).set(auth(admin))).status).toBe(204);
  });

  it('an interrupted purge mails the depot\'s subscribers once, and again when it escalates', async () => {
    const alert = await interruptedUnit(t, admin, { id: 'ML-1', depot: 'Frost yard' });
    const raised = await until(async () => (await mailbox()).find((m) => m.subject === 'DEF purge interrupted: ML-1 at Frost yard'));
    expect(raised.to).toEqual(['planner@test.local', 'technician@test.local']);
    expect(raised.from).toBe('desk@test.local');
    expect(raised.text).toContain('The supply was lost 12 s into the purge.');
    expect(raised.text).toContain('Air at key-off: -14.0 °C.');
    expect(raised.text).toContain('isolate the battery before working on the circuit');
    expect(raised.text).toContain(`Alert ${alert.id}`);
    const escalated = await until(async () => (await mailbox()).find((m) => m.subject === '[Escalated] DEF purge interrupted: ML-1 at Frost yard'), 15_000);
    expect(escalated.to).toEqual(['planner@test.local', 'technician@test.local']);
    // Acknowledging publishes the alert again: no further mail.
    await t.api.post(`/api/alerts/${alert.id}/acknowledge`).set(auth(admin)).send({});
    await t.service.alertsIdle();
    await t.service.mailIdle();
    expect((await mailbox()).filter((m) => m.subject.includes('ML-1')).length).toBe(2);
  });

  it('an alert at a depot nobody subscribed to sends nothing', async () => {
    await interruptedUnit(t, admin, { id: 'ML-2', depot: 'Quiet yard' });
    await t.service.alertsIdle();
    await t.service.mailIdle();
    expect((await mailbox()).some((m) => m.subject.includes('ML-2'))).toBe(false);
  });

  it('an admin sends the weekly digest to planners now', async () => {
    expect((await t.api.post('/api/mail/digest').set(auth(planner.token))).status).toBe(403);
    const res = await t.api.post('/api/mail/digest').set(auth(admin));
    expect(res.status).toBe(200);
    expect(res.body.recipients).toEqual(['planner@test.local']);
    const digest = await until(async () => (await mailbox()).find((m) => m.subject.startsWith('Afterwatch weekly digest')));
    expect(digest.to).toEqual(['planner@test.local']);
    // ML-1 (Frost yard) had one key-off, interrupted, this week.
    expect(digest.text).toMatch(/Frost yard: 1 key-offs, 1 interrupted purges \(100 %\), 1 alerts/);
  });
});

describe('e-mail through a real SMTP server', () => {
  it('with SMTP_URL set, mail goes to that server and no fake is started', async () => {
    const received: { to: string[]; raw: string }[] = [];
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      onData(stream, session, cb) {
        let raw = '';
        stream.on('data', (c: Buffer) => (raw += c.toString()));
        stream.on('end', () => {
          received.push({ to: session.envelope.rcptTo.map((r) => r.address), raw });
          cb();
        });
      },
    });
    await new Promise<void>((res) => server.listen(0, '127.0.0.1', () => res()));
    const port = (server.server.address() as AddressInfo).port;
    const s = await startTestService({ SMTP_URL: `smtp://127.0.0.1:${port}/?ignoreTLS=true` });
    try {
      const a = await s.token();
      const p = await addUser(s, a, 'planner');
      expect((await s.api.get('/api/mail/status').set(auth(a))).body).toEqual({ transport: 'smtp', fakePort: null });
      await s.api.post('/api/mail/digest').set(auth(a));
      expect(received.length).toBe(1);
      expect(received[0].to).toEqual([p.email]);
      expect(received[0].raw).toMatch(/^To: planner@test\.local$/m);
      expect(received[0].raw).toMatch(/^Afterwatch weekly digest, \d{4}-\d{2}-\d{2} to \d{4}-\d{2}-\d{2} \(UTC\)\.$/m);
      expect((await s.api.get('/api/mail/mailbox').set(auth(a))).body).toEqual([]);
    } finally {
      await s.stop();
      await new Promise<void>((res) => server.close(() => res()));
    }
  });
});
