/**
 * When sync runs: when the app opens online, when the network comes back, on demand (the caller
 * calls `syncNow`), and when the service worker's Background Sync fires. Background Sync is only a
 * trigger: the worker asks open pages to sync (`BACKGROUND_SYNC_MESSAGE`); the outbox in
 * IndexedDB, not the worker's queue, says what still has to go (see toolchain notes: a replayed
 * request that got an HTTP error counts as done in Workbox's queue).
 */

export const BACKGROUND_SYNC_TAG = 'tufa-outbox';
export const BACKGROUND_SYNC_MESSAGE = 'tufa-sync-now';

export interface TriggerEnv {
  isOnline(): boolean;
  onOnline(fn: () => void): () => void;
  /** Messages from the service worker; absent where there is none. */
  onWorkerMessage?(fn: (data: unknown) => void): () => void;
}

export function browserTriggerEnv(): TriggerEnv {
  const sw = typeof navigator !== 'undefined' ? navigator.serviceWorker : undefined;
  return {
    isOnline: () => navigator.onLine,
    onOnline(fn) {
      window.addEventListener('online', fn);
      return () => window.removeEventListener('online', fn);
    },
    ...(sw
      ? {
          onWorkerMessage(fn: (data: unknown) => void) {
            const h = (e: MessageEvent) => fn(e.data);
            sw.addEventListener('message', h);
            return () => sw.removeEventListener('message', h);
          },
        }
      : {}),
  };
}

/** Starts the automatic triggers; returns a function that stops them. */
export function startSyncTriggers(
  sync: () => Promise<unknown>,
  env: TriggerEnv = browserTriggerEnv(),
): () => void {
  const run = () => {
    void sync().catch(() => undefined); // the status shows what went wrong
  };
  if (env.isOnline()) run();
  const stops = [env.onOnline(run)];
  if (env.onWorkerMessage) {
    stops.push(
      env.onWorkerMessage((data) => {
        if (data && typeof data === 'object' && (data as { type?: unknown }).type === BACKGROUND_SYNC_MESSAGE)
          run();
      }),
    );
  }
  return () => {
    for (const s of stops) s();
  };
}

interface SyncManagerLike {
  register(tag: string): Promise<void>;
}

/**
 * Asks the browser to wake the service worker when the network is back (Chromium only; elsewhere
 * this does nothing and the `online` trigger covers it). Call after a local change made offline.
 */
export async function requestBackgroundSync(): Promise<boolean> {
  try {
    const reg = (await navigator.serviceWorker?.ready) as
      | (ServiceWorkerRegistration & { sync?: SyncManagerLike })
      | undefined;
    if (!reg?.sync) return false;
    await reg.sync.register(BACKGROUND_SYNC_TAG);
    return true;
  } catch {
    return false;
  }
}

interface SyncEventLike {
  tag: string;
  waitUntil(p: Promise<unknown>): void;
}
interface WorkerScopeLike {
  addEventListener(type: 'sync', fn: (e: SyncEventLike) => void): void;
  clients: {
    matchAll(o: {
      type: 'window';
      includeUncontrolled: boolean;
    }): Promise<readonly { postMessage(m: unknown): void }[]>;
  };
}

/**
 * For the service worker (`sw/`): `listenForBackgroundSync(self)`. It tells every open page to
 * sync; with no page open it does nothing, and the next app start syncs from the outbox.
 */
export function listenForBackgroundSync(scope: WorkerScopeLike): void {
  scope.addEventListener('sync', (e) => {
    if (e.tag !== BACKGROUND_SYNC_TAG) return;
    e.waitUntil(
      scope.clients.matchAll({ type: 'window', includeUncontrolled: true }).then((cs) => {
        for (const c of cs) c.postMessage({ type: BACKGROUND_SYNC_MESSAGE });
      }),
    );
  });
}
