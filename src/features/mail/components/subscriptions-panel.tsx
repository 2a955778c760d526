import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { SelectField } from '../../../components/ui/field';
import { useSubscriptionChange, useSubscriptions } from '../api/subscriptions';

/** The depots whose alert mails the signed-in user gets; an admin also sees and removes everyone's. */
export function SubscriptionsPanel({ depots, me, isAdmin }: { depots: string[]; me: number; isAdmin: boolean }) {
  const subs = useSubscriptions();
  const change = useSubscriptionChange();
  const [depot, setDepot] = useState('');
  const mine = new Set((subs.data ?? []).filter((s) => s.userId === me).map((s) => s.depot));
  const others = (subs.data ?? []).filter((s) => s.userId !== me);
  return (
    <div className="flex flex-col gap-4">
      <ErrorNotice error={subs.error ?? change.error} />
      <ul className="flex flex-col gap-2" aria-label="My depots">
        {[...mine].map((d) => (
          <li key={d} className="flex items-center justify-between rounded-md border border-line bg-raised px-3 py-2">
            <span>{d}</span>
            <Button size="sm" variant="ghost" onClick={() => change.mutate({ depot: d, on: false })}>Unsubscribe</Button>
          </li>
        ))}
        {!mine.size && <li className="text-muted">You get no alert mails yet.</li>}
      </ul>
      <div className="flex flex-wrap items-end gap-3">
        <SelectField label="Depot" value={depot} onChange={(e) => setDepot(e.target.value)} className="min-w-64"
          options={[{ value: '', label: 'Choose a depot…' }, ...depots.filter((d) => !mine.has(d)).map((d) => ({ value: d, label: d }))]} />
        <Button variant="primary" disabled={!depot} onClick={() => change.mutate({ depot, on: true }, { onSuccess: () => setDepot('') })}>Subscribe</Button>
      </div>
      {isAdmin && others.length > 0 && (
        <div>
          <h3 className="mb-2 font-semibold">Other people&apos;s subscriptions</h3>
          <ul className="flex flex-col gap-1">
            {others.map((s) => (
              <li key={`${s.userId}/${s.depot}`} className="flex items-center justify-between gap-3">
                <span>{s.depot} · {s.name} ({s.email})</span>
                <Button size="sm" variant="ghost" onClick={() => change.mutate({ depot: s.depot, userId: s.userId, on: false })}>Remove</Button>
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
