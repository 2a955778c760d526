import { DataTable, type Column } from '../../../components/ui/data-table';
import type { BatterySummary } from '../../../../shared/api/battery';
import { AdviceBadge } from './advice-badge';

const pct = (v: number | null, digits = 0) => (v === null ? '—' : `${v.toFixed(digits)} %`);

export function BatteryTable({ rows, selected, onSelect }: { rows: BatterySummary[]; selected: string | null; onSelect: (unitId: string) => void }) {
  const columns: Column<BatterySummary>[] = [
    { key: 'unit', header: 'Unit', cell: (s) => <button type="button" className="font-medium underline" onClick={() => onSelect(s.unitId)} aria-pressed={selected === s.unitId}>{s.unitId}</button> },
    { key: 'depot', header: 'Depot', cell: (s) => s.depot },
    { key: 'system', header: 'System', align: 'right', cell: (s) => `${s.systemVoltage} V` },
    { key: 'parks', header: 'Parks (analysed)', align: 'right', cell: (s) => `${s.parks} (${s.analysed})` },
    { key: 'drain', header: 'Latest drain', align: 'right', cell: (s) => (s.latestDrainPctPerHour === null ? '—' : `${s.latestDrainPctPerHour.toFixed(2)} %/h`) },
    { key: 'weekend', header: 'Worst after 62 h', align: 'right', cell: (s) => pct(s.worstProjectedSoc) },
    { key: 'advice', header: 'Advice', cell: (s) => <AdviceBadge s={s} /> },
  ];
  return <DataTable caption="Battery drain by unit" columns={columns} rows={rows} rowKey={(s) => s.unitId} rowClassName={(s) => (s.unitId === selected ? 'bg-raised' : '')} empty="No units." />;
}
