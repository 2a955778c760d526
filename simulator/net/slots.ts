/** A counting limit on publishes in flight across all gateways; waiters are called back in order as slots free up. */
export class Slots {
  private used = 0;
  private readonly waiting: (() => void)[] = [];

  constructor(readonly limit: number) {}

  tryTake(onFree: () => void): boolean {
    if (this.used < this.limit) {
      this.used++;
      return true;
    }
    if (!this.waiting.includes(onFree)) this.waiting.push(onFree);
    return false;
  }

  give(): void {
    this.used--;
    const next = this.waiting.shift();
    if (next) next();
  }

  get inUse(): number {
    return this.used;
  }
}
