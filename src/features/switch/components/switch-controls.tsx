import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { CopyButton } from '../../../components/ui/copy-button';
import { Dialog } from '../../../components/ui/dialog';
import { errorText } from '../../../components/ui/error-notice';
import { useIssueSwitchPage, useRevokeSwitchPage, useSwitchSheet } from '../api/switch-admin';

/** Admin: the unit's switch page — issue or reissue (the old link stops), withdraw, open. */
export function SwitchControls({ unitId, depot }: { unitId: string; depot: string }) {
  const sheet = useSwitchSheet(depot);
  const issue = useIssueSwitchPage();
  const revoke = useRevokeSwitchPage();
  const [confirm, setConfirm] = useState<'reissue' | 'revoke' | null>(null);
  const entry = sheet.data?.find((e) => e.unitId === unitId);
  const url = issue.data?.unitId === unitId ? issue.data.url : entry?.url;
  const error = issue.error ?? revoke.error ?? sheet.error;

  return (
    <div className="flex flex-col gap-3">
      <p className="text-muted">
        {sheet.isPending ? 'Checking…' : entry ? 'This unit has a switch page.' : 'No switch page issued for this unit.'} The page needs no sign-in;
        anyone with the link sees this unit's hold or clear.
      </p>
      {url && (
        <p className="flex flex-wrap items-center gap-2">
          <a href={url} target="_blank" rel="noreferrer" className="break-all font-mono text-sm text-accent hover:underline">
            {url}
          </a>
          <CopyButton text={url} label="Copy link" />
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        {entry ? (
          <>
            <Button onClick={() => setConfirm('reissue')}>Reissue link</Button>
            <Button variant="danger" onClick={() => setConfirm('revoke')}>
              Withdraw link
            </Button>
          </>
        ) : (
          <Button variant="primary" disabled={issue.isPending || sheet.isPending} onClick={() => issue.mutate(unitId)}>
            Issue switch page
          </Button>
        )}
        {url && (
          <a href={url} target="_blank" rel="noreferrer" className="inline-flex items-center rounded-md border border-line bg-raised px-4 py-2 font-medium hover:bg-line">
            Open switch page
          </a>
        )}
      </div>
      {error && (
        <p role="alert" className="font-medium text-danger">
          {errorText(error)}
        </p>
      )}
      <Dialog
        open={confirm !== null}
        onClose={() => setConfirm(null)}
        title={confirm === 'revoke' ? 'Withdraw the switch link?' : 'Reissue the switch link?'}
        footer={
          <>
            <Button onClick={() => setConfirm(null)}>Cancel</Button>
            <Button
              variant={confirm === 'revoke' ? 'danger' : 'primary'}
              onClick={() => {
                if (confirm === 'revoke') revoke.mutate(unitId);
                else issue.mutate(unitId);
                setConfirm(null);
              }}
            >
              {confirm === 'revoke' ? 'Withdraw' : 'Reissue'}
            </Button>
          </>
        }
      >
        <p>
          The printed code and every open page for {unitId} stop working at once.
          {confirm === 'reissue' && ' Print the new code and replace the old one at the switch.'}
        </p>
      </Dialog>
    </div>
  );
}
