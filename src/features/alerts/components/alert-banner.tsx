import { useEffect, useRef, useState } from 'react';
import type { AlertView } from '../../../../shared/realtime/envelope';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { alertSoundMuted, playAlertSound, setAlertSoundMuted } from '../../../lib/alert-sound';
import { formatCelsius, formatDateTime } from '../../../lib/format';
import { freezeWords } from '../../../lib/freeze-words';
import { dismissBannerAlert } from '../../../lib/live-feed';
import { useStore } from '../../../lib/live-store';
import { useAlertAction } from '../api/alert-actions';
import { ALERT_ACTION, ALERT_CAUTION, KIND_LABELS, secondsIntoWords } from '../lib/alert-words';
import { EscalatedMark } from './alerts-table';

export interface AlertBannerProps {
  alerts: AlertView[];
  /** Monitor or admin: may acknowledge. */
  canAct: boolean;
  unitName?: (unitId: string) => string | undefined;
}

function WarningMark() {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className="h-12 w-12 shrink-0 text-state-interrupted">
      <path d="M12 2.5 22.5 21h-21z" fill="currentColor" />
      <path d="M12 9v6M12 17.8v.2" stroke="#10151c" strokeWidth="2.6" strokeLinecap="round" />
    </svg>
  );
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <div>
      <dt className="text-sm font-medium uppercase tracking-wide text-muted">{label}</dt>
      <dd className="font-mono text-2xl font-medium tabular-nums">{value}</dd>
    </div>
  );
}

function BannerItem({ alert, canAct, name }: { alert: AlertView; canAct: boolean; name?: string }) {
  const act = useAlertAction();
  const [comment, setComment] = useState('');
  return (
    <article
      aria-label={`${KIND_LABELS[alert.kind]}: unit ${alert.unitId}`}
      data-alert-id={alert.id}
      className="rounded-lg border-2 border-state-interrupted bg-state-interrupted/12 p-5"
    >
      <div className="flex flex-wrap items-start gap-4">
        <WarningMark />
        <div className="min-w-0 flex-1">
          <h2 className="text-3xl font-bold leading-tight">
            {KIND_LABELS[alert.kind]} — <span className="font-mono">{alert.unitId}</span>
            {name && <span className="font-semibold text-muted"> {name}</span>}
          </h2>
          <p className="flex flex-wrap items-center gap-3 text-muted">
            {alert.depot} · raised {formatDateTime(alert.raisedAt)}
            {alert.escalatedAt && <EscalatedMark at={alert.escalatedAt} />}
          </p>
          <dl className="mt-3 flex flex-wrap gap-x-10 gap-y-2">
            <Fact label="Into the purge" value={secondsIntoWords(alert.secondsIntoPurge)} />
            <Fact label="Ambient" value={formatCelsius(alert.ambientC)} />
            <Fact label="Freeze exposure" value={freezeWords(alert.freezeExposure)} />
          </dl>
          <p className="mt-4 text-xl font-semibold">
            <span className="text-state-interrupted">Action: </span>
            {ALERT_ACTION}
          </p>
          <p className="mt-2 text-sm text-muted">
            <span className="font-semibold text-caution">Caution. </span>
            {ALERT_CAUTION}
          </p>
        </div>
      </div>
      <div className="mt-4 flex flex-wrap items-end gap-3">
        {canAct && (
          <>
            <label className="flex flex-col gap-1 text-sm font-medium text-muted">
              Comment (optional)
              <input
                value={comment}
                onChange={(e) => setComment(e.target.value)}
                maxLength={1000}
                className="w-80 rounded-md border border-line bg-raised px-3 py-2 text-base text-fg focus:border-accent focus:outline-none"
              />
            </label>
            <Button variant="primary" disabled={act.isPending} onClick={() => act.mutate({ id: alert.id, action: 'acknowledge', comment })}>
              {act.isPending ? 'Acknowledging…' : 'Acknowledge'}
            </Button>
          </>
        )}
        <Button variant="ghost" onClick={() => dismissBannerAlert(alert.id)}>
          Hide from banner
        </Button>
        {act.isError && (
          <p role="alert" className="font-medium text-danger">
            {errorText(act.error)}
          </p>
        )}
      </div>
    </article>
  );
}

/** The monitor's mute switch for the alert sound, remembered in this browser. */
export function AlertSoundToggle() {
  const muted = useStore(alertSoundMuted);
  return (
    <Button size="sm" variant="ghost" aria-pressed={muted} onClick={() => setAlertSoundMuted(!muted)}>
      <svg viewBox="0 0 20 20" aria-hidden="true" className="h-4 w-4">
        <path d="M3 8h3l4-4v12l-4-4H3z" fill="currentColor" />
        {muted ? (
          <path d="m13 7 5 6m0-6-5 6" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
        ) : (
          <path d="M13 7.5a3.5 3.5 0 0 1 0 5M15 5a7 7 0 0 1 0 10" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        )}
      </svg>
      {muted ? 'Alert sound off' : 'Alert sound on'}
    </Button>
  );
}

/** New open alerts that came in over the live feed, loud and at the top of the board; a short sound for each new one. */
export function AlertBanner({ alerts, canAct, unitName }: AlertBannerProps) {
  const heard = useRef(new Set<number>());
  useEffect(() => {
    const fresh = alerts.filter((a) => !heard.current.has(a.id));
    fresh.forEach((a) => heard.current.add(a.id));
    if (fresh.length > 0) playAlertSound();
  }, [alerts]);

  if (alerts.length === 0) return null;
  return (
    <section aria-label="New alerts" className="mb-6">
      <div role="alert" className="flex flex-col gap-3">
        {alerts.map((a) => (
          <BannerItem key={a.id} alert={a} canAct={canAct} name={unitName?.(a.unitId)} />
        ))}
      </div>
    </section>
  );
}
