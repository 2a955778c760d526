import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { SelectField, TextField } from '../../../components/ui/field';
import { useRecordCheck } from '../api/work-order-mutations';
import { CHECK_WORDS } from '../lib/words';

type PassFailKey = 'defFreezeDamage' | 'isolator' | 'indicator';

const HINTS: Record<PassFailKey, string> = {
  defFreezeDamage: 'Look for split or swollen lines, cracked connectors and a pump housing that has bulged; fail if in doubt.',
  isolator: 'Switches cleanly, contacts and cables sound, no heat marks.',
  indicator: 'The light beside the switch shows hold during a purge and clear after it.',
};

export function PassFailCheckForm({ orderId, checkKey }: { orderId: number; checkKey: PassFailKey }) {
  const record = useRecordCheck(orderId);
  const [error, setError] = useState<string | null>(null);

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const result = f.get('result');
    if (result !== 'pass' && result !== 'fail') return setError('Choose pass or fail.');
    setError(null);
    record.mutate({ key: checkKey, result, note: String(f.get('note') ?? '').trim() || undefined }, { onSuccess: () => form.reset(), onError: (err) => setError(errorText(err)) });
  }

  return (
    <form onSubmit={submit} noValidate aria-label={CHECK_WORDS[checkKey]} className="flex flex-col gap-2">
      <p className="text-sm text-muted">{HINTS[checkKey]}</p>
      <div className="grid gap-3 sm:grid-cols-[10rem_1fr_auto] sm:items-end">
        <SelectField label="Result" name="result" error={error ?? undefined} options={[{ value: '', label: 'Choose…' }, { value: 'pass', label: 'Pass' }, { value: 'fail', label: 'Fail' }]} />
        <TextField label="Note" name="note" maxLength={2000} />
        <Button type="submit" disabled={record.isPending}>Record</Button>
      </div>
    </form>
  );
}
