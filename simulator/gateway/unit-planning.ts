import { MINUTE } from '../core/time';
import { gapsOfDay, type Gap } from '../model/coverage';
import { planDay } from '../model/day-plan';
import type { UnitSpec } from '../model/fleet-types';
import type { EventQueue } from './event-queue';
import type { SimContext, SimEvent } from './sim-context';

/** Puts one day of a unit's plan (key cycles, watchdog resets, coverage gaps) on its event queue. */
export function planDayInto(ctx: SimContext, unit: UnitSpec, day: number, queue: EventQueue<SimEvent>, gaps: Gap[]): void {
  for (const c of planDay(ctx.plan, unit, day)) {
    queue.push({ at: c.on - c.leadMs, type: 'preKeyOn' });
    queue.push({ at: c.on, type: 'keyOn', off: c.off });
    if (c.watchdogAt !== null) queue.push({ at: c.watchdogAt, type: 'watchdog' });
    queue.push({ at: c.off, type: 'keyOff', isolation: c.isolation });
  }
  for (const g of gapsOfDay(ctx.coverage, unit.id, day)) {
    // A run with an end gets its coverage back half an hour before it, so stored messages go out.
    const to = ctx.end === null ? g.to : Math.min(g.to, ctx.end - 30 * MINUTE);
    if (to <= g.from || to <= ctx.start) continue;
    queue.push({ at: g.from, type: 'gap', begins: true });
    queue.push({ at: to, type: 'gap', begins: false });
    gaps.push({ from: Math.max(g.from, ctx.start), to });
  }
}
