import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { Loading } from '../../../components/ui/loading';
import { formatDateTime } from '../../../lib/format';
import { useMailbox, useMailStatus, useSendDigest } from '../api/mailbox';

/** What the development SMTP fake received: a list, and the chosen message's body. */
export function MailboxView() {
  const mails = useMailbox();
  const status = useMailStatus();
  const digest = useSendDigest();
  const [chosen, setChosen] = useState<number | null>(null);
  const open = mails.data?.find((m) => m.id === chosen) ?? mails.data?.[0] ?? null;
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-4">
        <Button variant="primary" disabled={digest.isPending} onClick={() => digest.mutate()}>Send the weekly digest now</Button>
        {digest.data && <p role="status">Digest sent to {digest.data.recipients.length ? digest.data.recipients.join(', ') : 'nobody (no planners)'}.</p>}
        <ErrorNotice error={digest.error} />
      </div>
      {status.data?.transport === 'smtp' && <p className="text-muted">Mail goes through the SMTP server in SMTP_URL: this mailbox only shows what the local fake received earlier.</p>}
      {status.data?.transport === 'fake' && <p className="text-muted">Development mail fake on 127.0.0.1:{status.data.fakePort}. Nothing leaves this machine.</p>}
      {mails.isPending && <Loading label="Loading the mailbox…" />}
      <ErrorNotice error={mails.error} />
      {mails.data && !mails.data.length && <p className="text-muted">No messages yet.</p>}
      {mails.data && mails.data.length > 0 && (
        <div className="grid gap-4 lg:grid-cols-[24rem_1fr]">
          <ul className="flex max-h-[36rem] flex-col gap-1 overflow-y-auto" aria-label="Messages">
            {mails.data.map((m) => (
              <li key={m.id}>
                <button type="button" onClick={() => setChosen(m.id)} className={`w-full rounded-md border px-3 py-2 text-left ${open?.id === m.id ? 'border-accent bg-raised' : 'border-line'}`}>
                  <span className="block truncate font-medium">{m.subject}</span>
                  <span className="block truncate text-sm text-muted">{m.to.join(', ')} · {formatDateTime(m.receivedAt)}</span>
                </button>
              </li>
            ))}
          </ul>
          {open && (
            <article className="rounded-md border border-line bg-raised p-4" aria-label="Message">
              <h3 className="text-lg font-semibold">{open.subject}</h3>
              <p className="text-sm text-muted">From {open.from ?? '—'} to {open.to.join(', ')} · {formatDateTime(open.receivedAt)}</p>
              <pre className="mt-3 whitespace-pre-wrap font-sans">{open.text}</pre>
            </article>
          )}
        </div>
      )}
    </div>
  );
}
