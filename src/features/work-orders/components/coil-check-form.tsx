import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { TextField } from '../../../components/ui/field';
import { COIL_BAND_SOURCE, COIL_RESISTANCE_BANDS } from '../../../../shared/checks/coil-resistance';
import { useRecordCheck } from '../api/work-order-mutations';

/** The relay coil, measured between terminals 85 and 86 with the relay out of its socket. */
export function CoilCheckForm({ orderId, systemVoltage }: { orderId: number; systemVoltage: number }) {
  const record = useRecordCheck(orderId);
  const [error, setError] = useState<string | null>(null);
  const band = COIL_RESISTANCE_BANDS[systemVoltage === 24 ? 24 : 12];

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const text = String(f.get('ohms') ?? '').trim().replace(',', '.');
    const ohms = Number(text);
    if (!text || !Number.isFinite(ohms) || ohms < 0) return setError('Enter the measured resistance in ohms (a number, 0 or more).');
    setError(null);
    record.mutate({ key: 'coilResistance', ohms, note: String(f.get('note') ?? '').trim() || undefined }, { onSuccess: () => form.reset(), onError: (err) => setError(errorText(err)) });
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3">
      <p className="text-sm text-muted">
        Expected on this {systemVoltage} V system: {band.minOhms}–{band.maxOhms} Ω (12 V: 30–130 Ω, 24 V: 200–400 Ω; {COIL_BAND_SOURCE}). The relay maker&apos;s data sheet prevails.
      </p>
      <div className="grid gap-3 sm:grid-cols-[12rem_1fr]">
        <TextField label="Coil resistance (Ω)" name="ohms" inputMode="decimal" autoComplete="off" error={error ?? undefined} />
        <TextField label="Note (optional)" name="note" maxLength={2000} />
      </div>
      <div><Button type="submit" variant="primary" disabled={record.isPending}>Record coil reading</Button></div>
    </form>
  );
}
