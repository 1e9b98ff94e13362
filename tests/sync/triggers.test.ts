import { describe, expect, it } from 'vitest';
import {
  BACKGROUND_SYNC_MESSAGE,
  BACKGROUND_SYNC_TAG,
  listenForBackgroundSync,
  startSyncTriggers,
} from '../../src/sync/sync-triggers';

function fakeEnv(online: boolean) {
  const onOnline: (() => void)[] = [];
  const onMsg: ((d: unknown) => void)[] = [];
  return {
    env: {
      isOnline: () => online,
      onOnline: (fn: () => void) => {
        onOnline.push(fn);
        return () => onOnline.splice(onOnline.indexOf(fn), 1);
      },
      onWorkerMessage: (fn: (d: unknown) => void) => {
        onMsg.push(fn);
        return () => onMsg.splice(onMsg.indexOf(fn), 1);
      },
    },
    goOnline: () => {
      for (const f of onOnline) f();
    },
    message: (d: unknown) => {
      for (const f of onMsg) f(d);
    },
  };
}

describe('sync triggers', () => {
  it('syncs on open when online, when the network returns and when the worker asks', () => {
    let runs = 0;
    const sync = async () => {
      runs++;
    };
    const online = fakeEnv(true);
    const stop = startSyncTriggers(sync, online.env);
    expect(runs).toBe(1);
    online.goOnline();
    online.message({ type: BACKGROUND_SYNC_MESSAGE });
    online.message({ type: 'something-else' });
    expect(runs).toBe(3);
    stop();
    online.goOnline();
    expect(runs).toBe(3);

    const offline = fakeEnv(false);
    startSyncTriggers(sync, offline.env);
    expect(runs).toBe(3); // opened offline: waits for the network
    offline.goOnline();
    expect(runs).toBe(4);
  });

  it('the worker only tells open pages to sync (trigger, not a queue)', async () => {
    const posted: unknown[] = [];
    let handler: ((e: { tag: string; waitUntil(p: Promise<unknown>): void }) => void) | undefined;
    listenForBackgroundSync({
      addEventListener: (_t, fn) => {
        handler = fn;
      },
      clients: { matchAll: async () => [{ postMessage: (m: unknown) => posted.push(m) }] },
    });
    const waits: Promise<unknown>[] = [];
    handler!({ tag: 'other', waitUntil: (p) => waits.push(p) });
    handler!({ tag: BACKGROUND_SYNC_TAG, waitUntil: (p) => waits.push(p) });
    await Promise.all(waits);
    expect(posted).toEqual([{ type: BACKGROUND_SYNC_MESSAGE }]);
  });
});
