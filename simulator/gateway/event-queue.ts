/** A small time-ordered queue; events at the same time keep their insertion order. */
export class EventQueue<E extends { at: number }> {
  private items: E[] = [];

  push(e: E): void {
    let lo = 0;
    let hi = this.items.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.items[mid].at <= e.at) lo = mid + 1;
      else hi = mid;
    }
    this.items.splice(lo, 0, e);
  }

  peekAt(): number {
    return this.items.length > 0 ? this.items[0].at : Infinity;
  }

  shift(): E | undefined {
    return this.items.shift();
  }
}
