import type { RosterColumn, RosterPreview } from '../../../../shared/api/roster';

const CELLS: { column: RosterColumn; header: string }[] = [
  { column: 'unit_id', header: 'Unit id' },
  { column: 'name', header: 'Name' },
  { column: 'depot', header: 'Depot' },
  { column: 'system_voltage', header: 'Volts' },
  { column: 'purge_seconds', header: 'Purge (s)' },
  { column: 'gateway_id', header: 'Gateway' },
];

/** Each row of the file with its bad cells marked and their messages beside the row. */
export function RosterPreviewTable({ preview }: { preview: RosterPreview }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full border-collapse text-left" aria-label="Roster preview">
        <thead className="bg-raised text-sm uppercase tracking-wide text-muted">
          <tr>
            <th className="px-3 py-2">Line</th>
            {CELLS.map((c) => <th key={c.column} className="px-3 py-2">{c.header}</th>)}
            <th className="px-3 py-2">Problems</th>
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((r) => {
            const bad = new Set(r.errors.map((e) => e.column));
            return (
              <tr key={r.line} className={`border-t border-line ${r.errors.length ? 'bg-danger/10' : ''}`} data-line={r.line}>
                <td className="px-3 py-2 font-mono">{r.line}</td>
                {CELLS.map((c) => (
                  <td key={c.column} className={`px-3 py-2 ${bad.has(c.column) ? 'font-semibold text-danger underline decoration-wavy' : ''}`} aria-invalid={bad.has(c.column) || undefined}>
                    {r.cells[c.column] === '' ? <span className="text-muted">—</span> : r.cells[c.column]}
                  </td>
                ))}
                <td className="px-3 py-2 text-sm">
                  {r.errors.length ? (
                    <ul className="text-danger">{r.errors.map((e, i) => <li key={i}>{e.column ? `${e.column}: ` : ''}{e.message}</li>)}</ul>
                  ) : <span className="text-state-safe">OK</span>}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
