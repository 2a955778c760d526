// Builds a unit's real history through its gateway: key-offs that complete or are interrupted, and DM1 faults at a key-on.
import type { TestGateway } from '../../helpers/gateway';
import { MessageSeq } from '../../helpers/messages';
import { encodeDm1 } from '../../../shared/j1939/dm1';
import { bytesToHex } from '../../../shared/j1939/hex';
import { encodeCanId } from '../../../shared/j1939/can-id';

export const H = 3_600_000;
export const MIN = 60_000;

export class UnitHistory {
  private m = new MessageSeq(1);
  private bootRecord: { ts: number; cause: string } | null = null;
  constructor(private gw: TestGateway, private ambientC: number, private volts = 12.6) {}

  private async tel(ts: number, key: 'on' | 'off', v: number) {
    await this.gw.publish('telemetry', this.m.telemetry(ts, key, v, { ambientC: this.ambientC }));
  }

  /** After a cut supply the gateway powers up again with a boot record naming how the last boot ended. */
  private async bootIfCut(ts: number) {
    if (!this.bootRecord) return;
    this.m.nextBoot();
    await this.gw.publish('power', this.m.power(ts, 'boot', this.volts, this.bootRecord));
    this.bootRecord = null;
  }

  /** Key on 5 min before, key off at keyOffAt, supply lost `seconds` into the purge. */
  async interrupted(keyOffAt: number, seconds: number) {
    await this.bootIfCut(keyOffAt - 6 * MIN);
    await this.tel(keyOffAt - 5 * MIN, 'on', 13.9);
    await this.tel(keyOffAt, 'off', this.volts);
    await this.gw.publish('power', this.m.power(keyOffAt + seconds * 1000, 'supply-lost', 2.0));
    this.bootRecord = { ts: keyOffAt + seconds * 1000, cause: 'supply-lost' };
  }

  /** Key on 5 min before (with a DM1 fault 2 s after key-on if given), key off, supply held past the 120 s purge. */
  async completed(keyOffAt: number, fault?: { spn: number; fmi: number }) {
    await this.bootIfCut(keyOffAt - 6 * MIN);
    const on = keyOffAt - 5 * MIN;
    await this.tel(on, 'on', 13.9);
    if (fault) {
      // SAE J1939-73 DM1 layout: amber lamp on, one DTC, from source address 0x00.
      const dm1 = bytesToHex(encodeDm1({ lamps: { mil: 'off', redStop: 'off', amberWarning: 'on', protect: 'off' }, dtcs: [{ ...fault, occurrenceCount: 1 }] }));
      const id = encodeCanId({ priority: 6, pgn: 65226, sourceAddress: 0 });
      await this.gw.publish('can', this.m.can(on + 2_500, [{ t: on + 2_000, id, data: dm1 }]));
    }
    await this.tel(on + 60_000, 'on', 13.9);
    await this.tel(keyOffAt, 'off', this.volts);
    await this.tel(keyOffAt + 125_000, 'off', this.volts);
  }

  /** Parked with the isolator closed: readings every 15 min (the protocol's parked cadence) from a voltage function. */
  async park(keyOffAt: number, hours: number, volts: (h: number) => number) {
    await this.bootIfCut(keyOffAt - 6 * MIN);
    await this.tel(keyOffAt - 5 * MIN, 'on', 13.9);
    await this.tel(keyOffAt, 'off', volts(0));
    await this.tel(keyOffAt + 125_000, 'off', volts(125 / 3600));
    for (let q = 1; q <= hours * 4; q++) await this.tel(keyOffAt + q * 15 * MIN, 'off', volts(q / 4));
  }
}
