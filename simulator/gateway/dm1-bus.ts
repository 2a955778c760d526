import type { Rng } from '../core/rng';
import { OTHER_FAULTS, PURGE_FAULTS, SA_AFTERTREATMENT, dm1Frames, type ActiveDtc, type Frame } from '../model/faults';

export interface Announced {
  dtc: ActiveDtc;
  /** true time of the frame that completed the first DM1 listing it */
  at: number;
}

/**
 * The controllers' diagnostic broadcasts. A controller with active codes sends DM1 once a second
 * (SAE J1939-73: DM1 repeats at 1 s while a code is active); when its last code clears it sends
 * one DM1 with no active DTC. The gateway's filter forwards these; an idle bus sends nothing here.
 */
export class Dm1Bus {
  private active: ActiveDtc[] = [];
  private readonly counts = new Map<string, number>();

  constructor(private readonly rng: Rng) {}

  get hasActive(): boolean {
    return this.active.length > 0;
  }

  private occurrence(sa: number, spn: number, fmi: number): number {
    const key = `${sa}/${spn}/${fmi}`;
    const n = Math.min(126, (this.counts.get(key) ?? this.rng.int(0, 2)) + 1);
    this.counts.set(key, n);
    return n;
  }

  /** Codes after an interrupted purge: one (a single frame) or two to three (BAM). */
  raisePurgeFaults(linkedKeyOffAt: string | null): ActiveDtc[] {
    const n = this.rng.chance(0.5) ? 1 : this.rng.int(2, 3);
    const dtcs = PURGE_FAULTS.slice(0, n).map((f) => this.make(SA_AFTERTREATMENT, f.spn, f.fmi, linkedKeyOffAt));
    return this.add(dtcs);
  }

  raiseOtherFault(): ActiveDtc[] {
    const f = this.rng.pick(OTHER_FAULTS);
    return this.add([this.make(f.sa, f.spn, f.fmi, null)]);
  }

  private make(sa: number, spn: number, fmi: number, linkedKeyOffAt: string | null): ActiveDtc {
    return { sa, spn, fmi, occurrenceCount: this.occurrence(sa, spn, fmi), linkedKeyOffAt, announced: false };
  }

  private add(dtcs: ActiveDtc[]): ActiveDtc[] {
    const fresh = dtcs.filter((d) => !this.active.some((a) => a.sa === d.sa && a.spn === d.spn && a.fmi === d.fmi));
    this.active.push(...fresh);
    return fresh;
  }

  /** One round of DM1 from every controller with active codes. */
  tick(t: number): { frames: Frame[]; announced: Announced[] } {
    const frames: Frame[] = [];
    const announced: Announced[] = [];
    for (const sa of [...new Set(this.active.map((d) => d.sa))]) {
      const dtcs = this.active.filter((d) => d.sa === sa);
      const f = dm1Frames(this.rng, t, sa, dtcs);
      frames.push(...f);
      for (const d of dtcs) {
        if (d.announced) continue;
        d.announced = true;
        announced.push({ dtc: d, at: f[f.length - 1].t });
      }
    }
    return { frames, announced };
  }

  /** Clears codes; each controller left with none says so once. */
  clear(t: number, which: readonly ActiveDtc[]): Frame[] {
    const sas = new Set(which.map((d) => d.sa));
    this.active = this.active.filter((d) => !which.includes(d));
    const frames: Frame[] = [];
    for (const sa of sas) {
      const left = this.active.filter((d) => d.sa === sa);
      frames.push(...dm1Frames(this.rng, t, sa, left));
    }
    return frames;
  }

  clearAll(t: number): Frame[] {
    return this.clear(t, [...this.active]);
  }
}
