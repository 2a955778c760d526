import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { ApiError } from '../../../lib/api-error';
import { ASSIGNMENT_CSV_COLUMNS, ASSIGNMENT_TEMPLATE, ImportPreviewSchema, type ImportPreview } from '../../../../shared/api/drivers';
import { useImportAssignments } from '../api/assignments';

function downloadTemplate() {
  const url = URL.createObjectURL(new Blob([ASSIGNMENT_TEMPLATE], { type: 'text/csv' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = 'driver-assignments-template.csv';
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

function PreviewTable({ preview }: { preview: ImportPreview }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Import preview</caption>
        <thead className="bg-raised uppercase tracking-wide text-muted">
          <tr><th className="px-3 py-2">Line</th>{ASSIGNMENT_CSV_COLUMNS.map((c) => <th key={c} className="px-3 py-2">{c}</th>)}<th className="px-3 py-2">Check</th></tr>
        </thead>
        <tbody className="bg-panel">
          {preview.rows.map((r) => {
            const bad = (col: string) => r.errors.some((e) => e.column === col);
            const cell = (col: string, v: string) => <td className={`px-3 py-2 ${bad(col) ? 'bg-danger/15 font-semibold text-danger' : ''}`}>{v || '—'}</td>;
            return (
              <tr key={r.line} className="border-t border-line">
                <td className="px-3 py-2 tabular-nums">{r.line}</td>
                {cell('driver_code', r.driverCode)}{cell('driver_name', r.driverName + (r.newDriver && r.driverName ? ' (new)' : ''))}{cell('unit_id', r.unitId)}{cell('from', r.from)}{cell('to', r.to)}
                <td className="px-3 py-2">{r.errors.length === 0 ? <span className="text-state-safe">OK</span> : <ul className="text-danger">{r.errors.map((e, i) => <li key={i}>{e.column}: {e.message}</li>)}</ul>}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/** Upload → preview with an error per bad cell → commit all rows at once (the server writes none if any row is bad). */
export function AssignmentImport() {
  const run = useImportAssignments();
  const [csv, setCsv] = useState<string | null>(null);
  const [fileName, setFileName] = useState('');
  const rejected = run.error instanceof ApiError && run.error.code === 'import_rejected' ? ImportPreviewSchema.safeParse(run.error.details) : null;
  const preview = run.data ?? (rejected?.success ? rejected.data : null);
  const onFile = async (file: File | undefined) => {
    run.reset();
    if (!file) return;
    const text = await file.text();
    setCsv(text);
    setFileName(file.name);
    run.mutate({ csv: text, commit: false });
  };
  return (
    <div className="flex flex-col gap-4">
      <p className="text-muted">Columns: {ASSIGNMENT_CSV_COLUMNS.join(', ')}. Times with their zone (e.g. 2026-11-23T05:30:00Z); an empty <em>to</em> means still driving; <em>driver_name</em> is needed only for a driver not on file.</p>
      <div className="flex flex-wrap items-center gap-3">
        <label className="inline-flex cursor-pointer items-center rounded-md border border-line bg-raised px-4 py-2 font-medium hover:bg-line">
          Choose a CSV file…
          <input type="file" accept=".csv,text/csv" className="sr-only" aria-label="Assignments CSV file" onChange={(e) => onFile(e.target.files?.[0])} />
        </label>
        <Button variant="ghost" onClick={downloadTemplate}>Download the template</Button>
        {fileName && <span className="text-muted">{fileName}</span>}
      </div>
      {preview && (
        <>
          <p role="status" className={preview.committed ? 'font-semibold text-state-safe' : preview.errorCount ? 'font-semibold text-danger' : ''}>
            {preview.committed ? `Imported ${preview.created} assignments.` : preview.errorCount ? `${preview.errorCount} error(s) in ${preview.rows.filter((r) => r.errors.length).length} of ${preview.rows.length} rows: fix the file and choose it again. Nothing is imported while any row is wrong.` : `${preview.rows.length} rows are ready to import.`}
          </p>
          <PreviewTable preview={preview} />
          {!preview.committed && (
            <div><Button variant="primary" disabled={preview.errorCount > 0 || run.isPending || !csv} onClick={() => csv && run.mutate({ csv, commit: true })}>Import all {preview.rows.length} rows</Button></div>
          )}
        </>
      )}
      {run.isError && !rejected?.success && <ErrorNotice title="The file was not accepted" error={run.error} />}
    </div>
  );
}
