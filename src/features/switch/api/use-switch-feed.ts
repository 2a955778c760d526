import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { LIVE_PATH } from '../../../../shared/realtime/envelope';
import { ApiError } from '../../../lib/api-error';
import { openLiveSocket, type LiveStatus } from '../../../lib/live-socket';
import { queryKeys } from '../../../lib/query-keys';
import type { SwitchPage } from '../types';
import { getSwitchPage } from './get-switch-page';

/** Close code the server uses when an admin withdraws (revokes or reissues) a switch link. */
export const SWITCH_REVOKED_CODE = 4003;

export type SwitchFeedStatus = LiveStatus | 'withdrawn';

/** Keeps the switch page's cache entry current over `/api/live?switch=<token>`. */
export function useSwitchFeed(token: string): SwitchFeedStatus {
  const qc = useQueryClient();
  const [status, setStatus] = useState<SwitchFeedStatus>('connecting');
  useEffect(() => {
    let withdrawn = false;
    const key = queryKeys.switchPage(token);
    const socket = openLiveSocket({
      path: `${LIVE_PATH}?switch=${encodeURIComponent(token)}`,
      onStatus: (s) => !withdrawn && setStatus(s),
      onMessage: (msg) => {
        if (msg.type === 'hello') void qc.invalidateQueries({ queryKey: key });
        if (msg.type === 'switch') {
          qc.setQueryData<SwitchPage>(key, (old) => (old ? { ...old, indicator: msg.indicator, sentAt: msg.sentAt, receivedAt: Date.now() } : old));
        }
      },
      onClose: (code, everOpened) => {
        if (code === SWITCH_REVOKED_CODE) {
          withdrawn = true;
          setStatus('withdrawn');
          return false;
        }
        // A refused upgrade shows only as a failed socket: the page's own read says whether the link still holds.
        if (!everOpened) {
          getSwitchPage(token).catch((err) => {
            if (err instanceof ApiError && err.status === 404) {
              withdrawn = true;
              socket.close();
              setStatus('withdrawn');
            }
          });
        }
      },
    });
    return () => socket.close();
  }, [qc, token]);
  return status;
}
