import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { formatCelsius, formatDateTime } from '../../../lib/format';
import { DEF_FREEZE_POINT_C } from '../../../../shared/protocol/limits';
import { useSetDepotLocation, type Depot, type DepotForecast } from '../api/depots';

function LocationEditor({ depot }: { depot: Depot }) {
  const save = useSetDepotLocation();
  const [lat, setLat] = useState(depot.latitude === null ? '' : String(depot.latitude));
  const [lon, setLon] = useState(depot.longitude === null ? '' : String(depot.longitude));
  const input = 'w-28 rounded-md border border-line bg-raised px-2 py-1 font-mono';
  return (
    <div className="flex flex-wrap items-center gap-2">
      <input aria-label={`Latitude of ${depot.name}`} className={input} value={lat} onChange={(e) => setLat(e.target.value)} placeholder="latitude" inputMode="decimal" />
      <input aria-label={`Longitude of ${depot.name}`} className={input} value={lon} onChange={(e) => setLon(e.target.value)} placeholder="longitude" inputMode="decimal" />
      <Button size="sm" disabled={save.isPending || !lat || !lon} onClick={() => save.mutate({ name: depot.name, latitude: Number(lat), longitude: Number(lon) })}>Save</Button>
      {save.isError && <span role="alert" className="text-sm text-danger">{errorText(save.error)}</span>}
    </div>
  );
}

/** Each depot: its coordinates (admins edit them) and the lowest forecast temperature in the next 48 h. */
export function DepotsTable({ depots, forecasts, editable }: { depots: Depot[]; forecasts: DepotForecast[]; editable: boolean }) {
  const byDepot = new Map(forecasts.map((f) => [f.depot, f]));
  return (
    <div className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full border-collapse text-left" aria-label="Depots">
        <thead className="bg-raised text-sm uppercase tracking-wide text-muted">
          <tr><th className="px-3 py-2">Depot</th><th className="px-3 py-2">Units</th><th className="px-3 py-2">Coordinates</th><th className="px-3 py-2">Low in 48 h</th><th className="px-3 py-2">Fetched</th></tr>
        </thead>
        <tbody>
          {depots.map((d) => {
            const f = byDepot.get(d.name);
            const freezing = f && f.lowC <= DEF_FREEZE_POINT_C;
            return (
              <tr key={d.name} className="border-t border-line">
                <td className="px-3 py-2 font-medium">{d.name}</td>
                <td className="px-3 py-2">{d.unitCount}</td>
                <td className="px-3 py-2">{editable ? <LocationEditor depot={d} /> : d.latitude === null ? <span className="text-muted">not set</span> : <span className="font-mono">{d.latitude}, {d.longitude}</span>}</td>
                <td className={`px-3 py-2 ${freezing ? 'font-semibold text-danger' : ''}`}>{f ? `${formatCelsius(f.lowC)} at ${formatDateTime(f.lowAt)}` : '—'}</td>
                <td className="px-3 py-2 text-sm text-muted">{f ? formatDateTime(f.fetchedAt) : '—'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
