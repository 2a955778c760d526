/** A text field's value, trimmed; '' when absent. */
export function readText(form: FormData, name: string): string {
  const v = form.get(name);
  return typeof v === 'string' ? v.trim() : '';
}

/** A numeric field: undefined when left empty, NaN when not a number (the schema then says so). */
export function readNumber(form: FormData, name: string): number | undefined {
  const v = readText(form, name);
  return v === '' ? undefined : Number(v.replace(',', '.'));
}

/** First message per field of a failed zod parse, keyed by the top-level field name. */
export function issuesByField(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) {
    const key = String(i.path[0] ?? 'form');
    if (!(key in out)) out[key] = i.message;
  }
  return out;
}
