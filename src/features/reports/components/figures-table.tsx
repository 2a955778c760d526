import { DataTable, type Column } from '../../../components/ui/data-table';
import type { ReportFigures } from '../../../../shared/api/reports';
import { pct, secs } from '../lib/figure-words';

/** The report's figures under one or more naming columns; rows arrive worst first from the server. */
export function figureColumns<T extends ReportFigures>(): Column<T>[] {
  return [
    { key: 'keyOffs', header: 'Key-offs', align: 'right', cell: (r) => r.keyOffs },
    { key: 'interrupted', header: 'Interrupted', align: 'right', cell: (r) => <span className={r.interrupted ? 'font-semibold text-danger' : ''}>{r.interrupted}</span> },
    { key: 'share', header: 'Share interrupted', align: 'right', cell: (r) => pct(r.shareInterrupted) },
    { key: 'median', header: 'Median into purge', align: 'right', cell: (r) => secs(r.medianSecondsIntoPurge) },
    { key: 'freeze', header: 'Freeze exposures', align: 'right', cell: (r) => r.freezeExposures },
    { key: 'faults', header: 'Faults explained', align: 'right', cell: (r) => r.faultsExplained },
  ];
}

export function FiguresTable<T extends ReportFigures>({ caption, rows, lead, rowKey, empty }: { caption: string; rows: T[]; lead: Column<T>[]; rowKey: (r: T) => string; empty?: string }) {
  return <DataTable caption={caption} columns={[...lead, ...figureColumns<T>()]} rows={rows} rowKey={rowKey} empty={empty ?? 'No key-offs in this week.'} />;
}
