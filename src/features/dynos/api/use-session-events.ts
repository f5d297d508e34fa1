import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { dynoKeys, runKeys, sessionKeys } from '@/lib/query-keys';

export type LiveState = 'connecting' | 'live' | 'reconnecting';

/**
 * Follows a session's live run events (Server-Sent Events) and refreshes the bay board on each
 * `run` event, and on `resync` (the server's listener was away). EventSource reconnects by itself;
 * the state says whether pulls are arriving live.
 */
export function useSessionEvents(sessionId: string | null, dynoId: string): { state: LiveState; lastEventAt: number | null } {
  const qc = useQueryClient();
  const [state, setState] = useState<LiveState>('connecting');
  const [lastEventAt, setLastEventAt] = useState<number | null>(null);
  useEffect(() => {
    if (!sessionId || typeof EventSource === 'undefined') return;
    setState('connecting');
    const source = new EventSource(`/api/sessions/${sessionId}/events`);
    const refresh = () => {
      setLastEventAt(Date.now());
      void qc.invalidateQueries({ queryKey: dynoKeys.board(dynoId) });
      void qc.invalidateQueries({ queryKey: sessionKeys.detail(sessionId) });
      void qc.invalidateQueries({ queryKey: runKeys.lists() });
    };
    source.onopen = () => {
      setState('live');
      // Anything stored while the stream was away is read again.
      void qc.invalidateQueries({ queryKey: dynoKeys.board(dynoId) });
    };
    source.onerror = () => setState('reconnecting');
    source.addEventListener('run', refresh);
    source.addEventListener('resync', refresh);
    return () => source.close();
  }, [sessionId, dynoId, qc]);
  return { state, lastEventAt };
}
