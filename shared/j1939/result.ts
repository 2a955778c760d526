// The outcome of decoding something that came from outside: a value, or a refusal that says why.
export type Result<T> = { ok: true; value: T } | { ok: false; reason: string };

export function accept<T>(value: T): Result<T> {
  return { ok: true, value };
}

export function refuse<T = never>(reason: string): Result<T> {
  return { ok: false, reason };
}
