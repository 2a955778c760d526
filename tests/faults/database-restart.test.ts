// PostgreSQL stopped and started again while gateways publish: ingest pauses (nothing is acknowledged that
// is not committed), then resumes, and every message is stored once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mqtt from 'mqtt';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { QueryTypes } from 'sequelize';
import { freePort, startLocalPostgres, type LocalPostgres } from '../../scripts/lib/local-postgres';
import { loadConfig } from '../../server/config';
import { startService, type Service } from '../../server/service';
import { ADMIN } from '../helpers/service';
import { provision } from '../helpers/gateway';
import { MessageSeq } from '../helpers/messages';
import { uplinkTopic } from '../../shared/protocol/topics';
import request from 'supertest';

let pg: LocalPostgres;
let service: Service;
let pgDir: string;
let pgPort: number;
beforeAll(async () => {
  pgDir = mkdtempSync(join(tmpdir(), 'afterwatch-pgrestart-'));
  pgPort = await freePort();
  pg = await startLocalPostgres({ dataDir: pgDir, port: pgPort });
  service = await startService(
    loadConfig({
      DATABASE_URL: pg.url, PORT: '0', MQTT_PORT: '0', DATA_DIR: pgDir, ADMIN_EMAIL: ADMIN.email, ADMIN_PASSWORD: ADMIN.password,
      JWT_SECRET: 'test-secret-of-sufficient-length', LOG_LEVEL: 'silent', DEMO: 'off',
    }),
  );
});
afterAll(async () => {
  await service?.close().catch(() => {});
  await pg?.stop();
});

describe('a database restart mid-stream', () => {
  it('pauses the ingest and resumes it with nothing lost or doubled', async () => {
    const api = request(`http://127.0.0.1:${service.port}`);
    const token = (await api.post('/api/auth/login').send(ADMIN)).body.token;
    const g = await provision(api, token, { id: 'PG-1' });
    const client = mqtt.connect(`mqtt://127.0.0.1:${service.mqttPort}`, {
      clientId: g.gatewayId, username: g.gatewayId, password: g.secret, clean: false, reconnectPeriod: 300, protocolVersion: 4,
    });
    await new Promise<void>((res) => client.once('connect', () => res()));
    // The service pauses rather than dropping the gateway: the connection stays open throughout.
    let closes = 0;
    client.on('close', () => closes++);
    const m = new MessageSeq(0);
    const t0 = Date.now() - 3_600_000;
    const total = 600;
    const acked: Promise<void>[] = [];
    let pgStopped = false;
    let ackedCount = 0;
    let ackedWhileDown = -1;
    for (let i = 0; i < total; i++) {
      // A key-off at sample 300, held to the end of the purge: the episode must come out completed once.
      const msg = m.telemetry(t0 + i * 5000, i < 300 ? 'on' : 'off', i < 300 ? 13.9 : 12.6);
      acked.push(new Promise<void>((res, rej) => client.publish(uplinkTopic(g.gatewayId, 'telemetry'), JSON.stringify(msg), { qos: 1 }, (e) => (e ? rej(e) : (ackedCount++, res())))));
      if (i === 200) {
        await Promise.all(acked);
        await pg.stop();
        pgStopped = true;
        ackedWhileDown = ackedCount;
      }
      if (i === 400 && pgStopped) {
        await new Promise((r) => setTimeout(r, 1500));
        // Nothing is acknowledged while nothing can be committed.
        expect(ackedCount).toBe(ackedWhileDown);
        const health = await api.get('/api/health');
        expect([health.status, health.body.db]).toEqual([503, 'error']);
        expect(service.ingest.pausedSince).not.toBeNull();
        // Held unacknowledged: what aedes has read of the 200 sent meanwhile (it reads a socket a chunk at a
        // time and the next chunk only once that one is settled; the rest waits in TCP).
        expect(service.ingest.backlog).toBeGreaterThan(0);
        expect(service.ingest.backlog).toBeLessThanOrEqual(200);
        pg = await startLocalPostgres({ dataDir: pgDir, port: pgPort });
      }
    }
    await Promise.all(acked);
    expect(closes).toBe(0);
    expect(service.ingest.pausedSince).toBeNull();
    client.end(true);
    const [row] = await service.ctx.sequelize.query<{ n: string; d: string }>(`SELECT count(*) n, count(DISTINCT seq) d FROM messages WHERE gateway_id = $1`, { bind: [g.gatewayId], type: QueryTypes.SELECT });
    expect(Number(row.n)).toBe(total);
    expect(Number(row.d)).toBe(total);
    const episodes = (await api.get('/api/episodes?unitId=PG-1').set('Authorization', `Bearer ${token}`)).body;
    expect(episodes).toHaveLength(1);
    expect(episodes[0]).toMatchObject({ outcome: 'completed', settledBy: 'powerHeld' });
  }, 120_000);
});
