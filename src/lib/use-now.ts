import { useSyncExternalStore } from 'react';

// One shared 1 s clock for every countdown and "time in state" cell, so a wall of a
// thousand rows runs one timer, and only the cells that show time re-render.
const listeners = new Set<() => void>();
let now = Date.now();
let timer: ReturnType<typeof setInterval> | null = null;

function subscribe(listener: () => void) {
  listeners.add(listener);
  if (timer === null) {
    now = Date.now();
    timer = setInterval(() => {
      now = Date.now();
      listeners.forEach((l) => l());
    }, 1000);
  }
  return () => {
    listeners.delete(listener);
    if (listeners.size === 0 && timer !== null) {
      clearInterval(timer);
      timer = null;
    }
  };
}

/** The wall-clock time in ms, refreshed once a second. */
export function useNow(): number {
  return useSyncExternalStore(subscribe, () => now, () => now);
}
