// A real service (PostgreSQL of this test file, broker and HTTP on free ports) for integration tests.
import request from 'supertest';
import { loadConfig } from '../../server/config';
import { startService, type Service } from '../../server/service';
import { createTestDatabase } from './test-db';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const ADMIN = { email: 'admin@test.local', password: 'admin-password-1' };

export interface TestService {
  service: Service;
  api: ReturnType<typeof request>;
  url: string;
  mqttUrl: string;
  token(email?: string, password?: string): Promise<string>;
  stop(): Promise<void>;
}

export async function startTestService(env: Record<string, string> = {}, opts: { wallNow?: () => number; staticDir?: string } = {}): Promise<TestService> {
  const db = await createTestDatabase();
  const config = loadConfig({
    DATABASE_URL: db.url,
    PORT: '0',
    MQTT_PORT: '0',
    DATA_DIR: mkdtempSync(join(tmpdir(), 'afterwatch-data-')),
    ADMIN_EMAIL: ADMIN.email,
    ADMIN_PASSWORD: ADMIN.password,
    JWT_SECRET: 'test-secret-of-sufficient-length',
    LOG_LEVEL: 'silent',
    DEMO: 'off',
    LOGIN_RATE_LIMIT: '1000',
    ...env,
  });
  const service = await startService(config, { wallNow: opts.wallNow, staticDir: opts.staticDir });
  const url = `http://127.0.0.1:${service.port}`;
  const api = request(url);
  return {
    service,
    api,
    url,
    mqttUrl: `mqtt://127.0.0.1:${service.mqttPort}`,
    async token(email = ADMIN.email, password = ADMIN.password) {
      const res = await api.post('/api/auth/login').send({ email, password });
      if (res.status !== 200) throw new Error(`login failed: ${res.status} ${JSON.stringify(res.body)}`);
      return res.body.token as string;
    },
    async stop() {
      await service.close();
      await db.drop();
    },
  };
}
