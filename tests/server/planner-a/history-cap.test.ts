// The pager's count stops at a cap, so a depot's long history costs no more than its first page.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestService, type TestService } from '../../helpers/service';

let t: TestService;
let token: string;
beforeAll(async () => {
  t = await startTestService();
  token = await t.token();
  await t.api.post('/api/units').set('Authorization', `Bearer ${token}`).send({ id: 'CAP-1', name: 'Capped', depot: 'Long history', systemVoltage: 12 });
  await t.service.ctx.sequelize.query(`
    INSERT INTO episodes (unit_id, stream, boot, seq, key_off_at, purge_seconds, loss_threshold_v, outcome, settled_by, ended_at, final)
    SELECT 'CAP-1', 0, n, 0, now() - (n || ' minutes')::interval, 120, 6, CASE WHEN n % 100 = 0 THEN 'interrupted' ELSE 'completed' END,
           'powerHeld', now() - (n || ' minutes')::interval + interval '2 minutes', true
    FROM generate_series(1, 10050) n`);
});
afterAll(async () => t?.stop());

describe('history paging over a long history', () => {
  it('counts up to 10,000 and says there are more; a narrower filter gets its exact count', async () => {
    const all = await t.api.get('/api/history/episodes?depot=Long%20history&pageSize=50').set('Authorization', `Bearer ${token}`);
    expect(all.status).toBe(200);
    expect(all.body).toMatchObject({ total: 10_000, totalCapped: true, page: 1, pageSize: 50 });
    expect(all.body.rows).toHaveLength(50);
    const few = await t.api.get('/api/history/episodes?depot=Long%20history&outcome=interrupted&pageSize=50').set('Authorization', `Bearer ${token}`);
    expect(few.body).toMatchObject({ total: 100, totalCapped: false });
  });
});
