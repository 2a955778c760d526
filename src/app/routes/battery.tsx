import { useAddressParams } from '../../lib/use-address-params';
import { CautionNote } from '../../components/ui/caution-note';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { useUnits } from '../../features/units/api/get-units';
import { useBatteryFleet } from '../../features/battery/api/get-battery';
import { BatteryTable } from '../../features/battery/components/battery-table';
import { UnitBattery } from '../../features/battery/components/unit-battery';
import { CONTROL_CLASS, DepotSelect } from '../../components/ui/depot-select';

const control = CONTROL_CLASS;
const SPANS = [7, 14, 30];

export function BatteryPage() {
  const { params, set } = useAddressParams();
  const days = SPANS.includes(Number(params.get('days'))) ? Number(params.get('days')) : 14;
  const depot = params.get('depot') ?? '';
  const unit = params.get('unit');
  const fleet = useBatteryFleet(days, depot || undefined);
  const depots = [...new Set((useUnits().data ?? []).map((u) => u.depot))].sort();
  return (
    <>
      <PageHeader
        title="Battery drain"
        description="How fast each unit's battery runs down while parked with the isolator closed, read from the rested open-circuit voltage (BCI table at 26.7 °C), and whether it would last a weekend connected. A battery that lasts is the way to end early isolation."
      />
      <CautionNote className="mb-6">
        These are estimates from the gateway's voltage readings, not a battery test. Deep discharge harms lead-acid batteries and a flat battery may freeze in hard frost: follow the battery maker's guidance and your workshop's procedures for testing, charging and any low-voltage disconnect, and isolate before working on the circuit.
      </CautionNote>
      <div role="search" aria-label="Battery settings" className="mb-4 flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Look back
          <select value={days} onChange={(e) => set('days', e.target.value)} className={control}>
            {SPANS.map((d) => <option key={d} value={d}>{d} days</option>)}
          </select>
        </label>
        <DepotSelect value={depot} depots={depots} onChange={(d) => set('depot', d)} className={control} />
      </div>
      {fleet.isPending && <Loading label="Reading the parks…" />}
      {fleet.isError && <ErrorNotice title="Could not load battery drain" error={fleet.error} />}
      {fleet.data && <BatteryTable rows={fleet.data} selected={unit} onSelect={(id) => set('unit', id)} />}
      {unit && (
        <Panel title="Parks of the unit" className="mt-6">
          <UnitBattery key={`${unit}-${days}`} unitId={unit} days={days} />
        </Panel>
      )}
    </>
  );
}
