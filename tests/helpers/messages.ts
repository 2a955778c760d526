// Builders of protocol messages for tests, with seq counted per boot as the protocol requires.
export const iso = (ms: number) => new Date(ms).toISOString();

export class MessageSeq {
  private seq = 0;
  constructor(public boot: number) {}
  nextBoot() {
    this.boot += 1;
    this.seq = 0;
  }
  telemetry(ts: number, key: 'on' | 'off', supplyV: number, opts: { ambientC?: number | null; ecmAwake?: boolean } = {}) {
    return { boot: this.boot, seq: this.seq++, ts: iso(ts), key, supplyV, ambientC: opts.ambientC ?? -4, ecmAwake: opts.ecmAwake ?? true };
  }
  power(ts: number, event: 'supply-lost' | 'supply-restored' | 'boot', supplyV: number, prevShutdown: { ts: number; cause: string } | null = null) {
    return { boot: this.boot, seq: this.seq++, ts: iso(ts), event, supplyV, ...(event === 'boot' ? { prevShutdown: prevShutdown && { ts: iso(prevShutdown.ts), cause: prevShutdown.cause } } : {}) };
  }
  can(ts: number, frames: { t: number; id: string; data: string }[]) {
    return { boot: this.boot, seq: this.seq++, ts: iso(ts), frames: frames.map((f) => ({ ...f, t: iso(f.t) })) };
  }
}
