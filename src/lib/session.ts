import { useSyncExternalStore } from 'react';
import { createSessionStore, type Session, type SessionStore } from './session-store';

/** The browser's session, shared by the API client and the pages. */
export const session: SessionStore = createSessionStore(window.localStorage);

/** The current session; re-renders when it starts or ends. */
export function useSession(): Session | null {
  return useSyncExternalStore(session.subscribe, session.get, () => null);
}
