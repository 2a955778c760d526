// A hand-built fortnight (ISO weeks 2026-W46 and W47, UTC) of three units in two depots, with two drivers.
import type { TestService } from '../../helpers/service';
import { connectGateway, provision } from '../../helpers/gateway';
import { H, UnitHistory } from './unit-history';

// ISO 8601: 2026-W47 starts Monday 16 November 2026 (1 January 2026 is a Thursday, so W01 starts 29 December 2025).
export const W46 = Date.UTC(2026, 10, 9);
export const W47 = Date.UTC(2026, 10, 16);
export const W48 = Date.UTC(2026, 10, 23);
const day = (weekStart: number, d: number, hour: number) => weekStart + d * 24 * H + hour * H;

export const D1_NAME = '=Driver "One", early';
export const N1_NAME = 'Tractor "North", 1';

export async function buildFleetWeek(t: TestService, token: string) {
  const auth = { Authorization: `Bearer ${token}` };
  const gw = async (id: string, depot: string) => {
    const g = await provision(t.api, token, { id, depot });
    return connectGateway(t.mqttUrl, g.gatewayId, g.secret);
  };
  const [g1, g2, g3] = [await gw('N-1', 'North'), await gw('N-2', 'North'), await gw('S-1', 'South')];
  await t.api.patch('/api/units/N-1').set(auth).send({ name: N1_NAME }).expect(200);

  const n1 = new UnitHistory(g1, 5); // band 'none'
  const n2 = new UnitHistory(g2, -15); // at or below -11 °C: 'frozen' (ISO 22241-1 freezing point)
  const s1 = new UnitHistory(g3, -8); // at or below -7 °C: 'atRisk'
  await n1.interrupted(day(W46, 1, 6), 10);
  await n1.completed(day(W46, 1, 12));
  await n1.interrupted(day(W47, 0, 6), 38);
  await n1.completed(day(W47, 0, 16));
  await n1.interrupted(day(W47, 1, 6), 20);
  await n1.completed(day(W47, 1, 16), { spn: 520201, fmi: 18 }); // fault at the first key-on after the interruption (invented SPNs in the range SAE J1939 leaves to manufacturers, 520192–524287, from memory)
  await n2.completed(day(W47, 2, 6));
  await n2.interrupted(day(W47, 2, 17), 60);
  await s1.interrupted(day(W47, 3, 6), 90);
  await s1.completed(day(W47, 3, 16), { spn: 520202, fmi: 5 });
  for (const g of [g1, g2, g3]) await g.end();

  const d1 = (await t.api.post('/api/drivers').set(auth).send({ code: 'D-1', name: D1_NAME, depot: 'North' }).expect(201)).body;
  const d2 = (await t.api.post('/api/drivers').set(auth).send({ code: 'D-2', name: 'Driver Two', depot: 'North' }).expect(201)).body;
  const assign = (driverId: number, unitId: string, from: number, to: number | null) =>
    t.api.post('/api/drivers/assignments').set(auth).send({ driverId, unitId, from: new Date(from).toISOString(), to: to === null ? null : new Date(to).toISOString() }).expect(201);
  await assign(d1.id, 'N-1', W47, day(W47, 1, 0));
  await assign(d2.id, 'N-1', day(W47, 1, 0), null);
  await assign(d2.id, 'N-2', W47, W48);
  return { d1: d1.id as number, d2: d2.id as number, day };
}
