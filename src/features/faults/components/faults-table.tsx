import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import type { Fault } from '../types';

const LAMP_NAMES: [keyof Fault['lamps'], string][] = [
  ['mil', 'MIL'],
  ['redStop', 'Red stop'],
  ['amberWarning', 'Amber warning'],
  ['protect', 'Protect'],
];

// SAE J1939-73 DM1 lamp status: only lamps that are on are listed, by name (the words carry it, not colour).
function Lamps({ lamps }: { lamps: Fault['lamps'] }) {
  const on = LAMP_NAMES.filter(([k]) => lamps[k] === 'on').map(([, label]) => label);
  return on.length ? <span>{on.join(', ')}</span> : <span className="text-muted">none on</span>;
}

export interface FaultsTableProps {
  faults: Fault[];
  /** Words for the episode a fault is linked to, e.g. "purge interrupted 12 Mar 14:02". */
  episodeLabel: (episodeId: number) => string;
}

/** Diagnostic trouble codes from DM1 (SAE J1939-73), with the purge episode that explains them. */
export function FaultsTable({ faults, episodeLabel }: FaultsTableProps) {
  const mono = 'font-mono tabular-nums';
  const columns: Column<Fault>[] = [
    { key: 'at', header: 'Seen', cell: (f) => formatDateTime(f.at) },
    {
      key: 'spn',
      header: 'SPN',
      align: 'right',
      cell: (f) => (
        <span className={mono} title={f.spnUncertain ? 'Sent in the older SPN layout (conversion method 1): the number may be misread' : undefined}>
          {f.spn}
          {f.spnUncertain && ' ?'}
        </span>
      ),
    },
    {
      key: 'fmi',
      header: 'FMI',
      cell: (f) => (
        <span>
          <span className={`${mono} font-medium`}>{f.fmi}</span> <span className="text-muted">{f.fmiText}</span>
        </span>
      ),
    },
    { key: 'count', header: 'Occurrences', align: 'right', cell: (f) => <span className={mono}>{f.occurrenceCount ?? '—'}</span> },
    { key: 'lamps', header: 'Lamps', cell: (f) => <Lamps lamps={f.lamps} /> },
    { key: 'source', header: 'Source', align: 'right', cell: (f) => <span className={mono}>{f.sourceAddress}</span> },
    {
      key: 'episode',
      header: 'Explained by',
      cell: (f) =>
        f.episodeId === null ? (
          <span className="text-muted">no purge episode</span>
        ) : (
          <a href={`#episode-${f.episodeId}`} className="text-accent hover:underline">
            {episodeLabel(f.episodeId)}
          </a>
        ),
    },
  ];
  return <DataTable caption="Faults" columns={columns} rows={faults} rowKey={(f) => String(f.id)} empty="No faults reported in this range." />;
}
