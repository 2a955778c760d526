/** Polls `fn` until it gives something truthy (for state that settles asynchronously, e.g. a retained message). */
export async function until<T>(fn: () => T | undefined | null | false | Promise<T | undefined | null | false>, ms = 8000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error('condition not met in time');
    await new Promise((r) => setTimeout(r, 25));
  }
}
