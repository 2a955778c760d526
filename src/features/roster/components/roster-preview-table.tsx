import type { RosterPreview, RosterRow } from '../../../../shared/api/roster';

const CELLS: { key: keyof RosterRow; column: string; header: string }[] = [
  { key: 'unitId', column: 'unit_id', header: 'Unit id' },
  { key: 'name', column: 'name', header: 'Name' },
  { key: 'depot', column: 'depot', header: 'Depot' },
  { key: 'systemVoltage', column: 'system_voltage', header: 'Volts' },
  { key: 'purgeSeconds', column: 'purge_seconds', header: 'Purge (s)' },
  { key: 'gatewayId', column: 'gateway_id', header: 'Gateway' },
];

/** Each row of the file with its bad cells marked and their messages beside the row. */
export function RosterPreviewTable({ preview }: { preview: RosterPreview }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full border-collapse text-left" aria-label="Roster preview">
        <thead className="bg-raised text-sm uppercase tracking-wide text-muted">
          <tr>
            <th className="px-3 py-2">Line</th>
            {CELLS.map((c) => <th key={c.key} className="px-3 py-2">{c.header}</th>)}
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
                  <td key={c.key} className={`px-3 py-2 ${bad.has(c.column as never) ? 'font-semibold text-danger underline decoration-wavy' : ''}`} aria-invalid={bad.has(c.column as never) || undefined}>
                    {r[c.key] === null || r[c.key] === '' ? <span className="text-muted">—</span> : String(r[c.key])}
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
