// What a worker's live feed has shown of each alert: its furthest stage, so that a relayed state it already
// pushed (or that a later one overtook) is dropped. Bounded: the oldest alerts are forgotten first.
import type { AlertView } from '../../shared/realtime/envelope';
import { alertStage } from './peer-wire';

/**
 * How many alerts' last stage a worker remembers. Far more alerts than a fleet raises while a notification
 * can be late; an alert forgotten past it is only re-checked less. Common practice, no published source.
 */
export const MAX_KNOWN_ALERTS = 20_000;

export class AlertStages {
  /** Alert id -> furthest stage shown, oldest first (a Map keeps insertion order). */
  private known = new Map<number, number>();

  constructor(private readonly limit = MAX_KNOWN_ALERTS) {}

  /** Notes the alert's stage; false if this stage or a later one was shown already. */
  advance(a: Pick<AlertView, 'id' | 'status' | 'escalatedAt'>): boolean {
    const stage = alertStage(a);
    const was = this.known.get(a.id);
    if (was !== undefined && was >= stage) return false;
    this.known.delete(a.id); // to the newest end
    this.known.set(a.id, stage);
    if (this.known.size > this.limit) this.known.delete(this.known.keys().next().value!);
    return true;
  }

  get size() {
    return this.known.size;
  }
}
