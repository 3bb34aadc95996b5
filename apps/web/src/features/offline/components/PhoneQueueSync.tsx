import { useEffect } from 'react';
import { api, sessionStore } from '../../../lib/api';
import { isOfflineSession } from '../../../lib/offlineSession';
import { hasWaiting, sendWaiting, showQueueOf } from '../phoneQueue';

/** A phone can say it is online with no way through (a weak bar at the field edge); try again now and then. */
const RETRY_MS = 15_000;

/**
 * Sends the signed-in person's waiting entries when the app starts, after each sign-in, when
 * the phone gets its signal back or wakes up, and every little while as long as some wait. A
 * session resumed without signal is first renewed through the refresh cookie; if that has
 * expired the person signs in again and the queue waits for them.
 */
export function PhoneQueueSync({ userId }: { userId: string }) {
  useEffect(() => {
    showQueueOf(userId);
    let busy = false;
    const trySend = async () => {
      if (busy || !navigator.onLine) return;
      busy = true;
      try {
        if (isOfflineSession(sessionStore.get())) await api.refreshSession().catch(() => null);
        const session = sessionStore.get();
        if (session?.user.id === userId && !isOfflineSession(session)) await sendWaiting(userId);
      } finally {
        busy = false;
      }
    };
    void trySend();
    const onOnline = () => void trySend();
    const onVisible = () => {
      if (document.visibilityState === 'visible') void trySend();
    };
    const timer = window.setInterval(() => {
      if (hasWaiting(userId)) void trySend();
    }, RETRY_MS);
    window.addEventListener('online', onOnline);
    document.addEventListener('visibilitychange', onVisible);
    return () => {
      window.clearInterval(timer);
      window.removeEventListener('online', onOnline);
      document.removeEventListener('visibilitychange', onVisible);
      showQueueOf(null);
    };
  }, [userId]);
  return null;
}
