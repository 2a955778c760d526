import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../helpers/service';

let t: TestService;
beforeAll(async () => {
  t = await startTestService();
});
afterAll(async () => t?.stop());

describe('health', () => {
  it('reports the database and the broker as ok without a token', async () => {
    const res = await t.api.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok', broker: 'ok' });
  });
});
