import { useState, type ChangeEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { ROSTER_COLUMNS, type RosterCommitResult } from '../../../../shared/api/roster';
import { downloadTemplate, useCommitRoster, usePreviewRoster } from '../api/roster';
import { RosterPreviewTable } from './roster-preview-table';
import { RosterResult } from './roster-result';

/** Choose a file → preview (nothing created) → import all rows at once, only when every row is good. */
export function RosterImport() {
  const preview = usePreviewRoster();
  const commit = useCommitRoster();
  const [csv, setCsv] = useState<string | null>(null);
  const [fileName, setFileName] = useState('');
  const [result, setResult] = useState<RosterCommitResult | null>(null);
  const [templateError, setTemplateError] = useState<unknown>(null);

  async function choose(e: ChangeEvent<HTMLInputElement>) {
    const file = e.target.files?.[0];
    setResult(null);
    commit.reset();
    if (!file) return;
    const text = await file.text();
    setFileName(file.name);
    setCsv(text);
    preview.mutate(text);
  }

  const p = preview.data;
  return (
    <div className="flex flex-col gap-5">
      <p className="text-muted">Columns: <code className="font-mono">{ROSTER_COLUMNS.join(', ')}</code>. System voltage 12 or 24; purge time 10–3600 s (empty = 120 s); gateway id may be empty.</p>
      <div className="flex flex-wrap items-end gap-4">
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Roster file (CSV)
          <input type="file" name="roster" accept=".csv,text/csv" onChange={choose} className="text-fg" />
        </label>
        <Button onClick={() => downloadTemplate().catch(setTemplateError)}>Download template</Button>
      </div>
      <ErrorNotice error={templateError} title="Could not download the template" />
      {preview.isPending && <p role="status" className="text-muted">Checking {fileName}…</p>}
      <ErrorNotice error={preview.error} title="Could not check the file" />
      {p && !result && (
        <>
          {p.fileErrors.length > 0 && <ul role="alert" className="rounded-md border border-danger/50 bg-danger/10 px-4 py-3 text-danger">{p.fileErrors.map((e) => <li key={e}>{e}</li>)}</ul>}
          <p role="status" className={p.ok ? 'text-state-safe' : 'font-medium text-danger'}>
            {p.ok ? `${p.rows.length} rows, all good: ready to import.` : `${p.errorCount} problem${p.errorCount === 1 ? '' : 's'} in ${fileName}: fix the file and choose it again. Nothing has been created.`}
          </p>
          {p.rows.length > 0 && <RosterPreviewTable preview={p} />}
          <div>
            <Button variant="primary" disabled={!p.ok || commit.isPending || !csv} onClick={() => csv && commit.mutate(csv, { onSuccess: setResult })}>
              {commit.isPending ? 'Importing…' : `Import ${p.rows.length} units`}
            </Button>
          </div>
          <ErrorNotice error={commit.error} title="Nothing was imported" />
        </>
      )}
      {result && <RosterResult result={result} />}
    </div>
  );
}
