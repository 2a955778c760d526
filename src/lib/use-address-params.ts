import { useRef } from 'react';
import { useSearchParams } from 'react-router-dom';

/**
 * A page's settings kept in the address (filters, spans, sort). React Router renders a navigation in a
 * transition, so a second change can come before the first has rendered (clear the search, then pick a
 * depot; two quick clicks on a column). Each change applies to the settings last written, not to those of
 * the last render, or it would quietly undo the one before it. A change of address from elsewhere (a
 * link, the menu) starts afresh.
 */
export function useAddressParams() {
  const [params, setParams] = useSearchParams();
  const key = params.toString();
  const written = useRef<{ keys: Set<string>; latest: URLSearchParams } | null>(null);

  const update = (change: (current: URLSearchParams) => URLSearchParams) => {
    const ours = written.current?.keys.has(key) ? written.current : null;
    const next = change(new URLSearchParams(ours ? ours.latest : params));
    // Once the render has caught up with the last change, only what comes after it is ours to build on.
    const caughtUp = ours && key === ours.latest.toString();
    const keys = ours && !caughtUp ? ours.keys : new Set([key]);
    keys.add(next.toString());
    written.current = { keys, latest: next };
    setParams(next, { replace: true });
  };
  /** Sets one setting, or removes it when `value` is empty. */
  const set = (name: string, value: string) =>
    update((p) => {
      if (value) p.set(name, value);
      else p.delete(name);
      return p;
    });
  return { params, key, update, set };
}
