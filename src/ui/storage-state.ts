/** How safe the data on this device is: persistence, space used and left, in plain words. */

export interface StorageState {
  persisted: boolean | undefined;
  usage: number | undefined;
  quota: number | undefined;
}

export async function storageState(): Promise<StorageState> {
  const sm = navigator.storage;
  const [persisted, est] = await Promise.all([
    sm?.persisted ? sm.persisted().catch(() => undefined) : Promise.resolve(undefined),
    sm?.estimate ? sm.estimate().catch(() => undefined) : Promise.resolve(undefined),
  ]);
  return { persisted, usage: est?.usage, quota: est?.quota };
}

export async function askPersistence(): Promise<boolean> {
  return navigator.storage?.persist ? navigator.storage.persist().catch(() => false) : false;
}

let askedAfterSave = false;

/**
 * Asks once per session for persistent storage after readings are saved (a first reading, an
 * import, a restore), not only from the button in Settings: data on a device that is not
 * persistent may be evicted. Browsers that ask the user show their own prompt; others decide from
 * how the site is used. Answers whether storage is persistent (undefined: not asked again).
 */
export async function askPersistenceAfterSave(): Promise<boolean | undefined> {
  if (askedAfterSave) return undefined;
  askedAfterSave = true;
  const sm = navigator.storage;
  if (!sm?.persist) return undefined;
  if (sm.persisted && (await sm.persisted().catch(() => false))) return true;
  return sm.persist().catch(() => false);
}

/** The warning a user should read, or undefined when storage is persistent and roomy. */
export function evictionWarning(s: StorageState): string | undefined {
  if (s.quota !== undefined && s.usage !== undefined && s.quota > 0 && s.usage / s.quota > 0.8) {
    return 'This device is nearly out of the space the browser gives Tufa. New readings may fail to save: sync or export now, and free some space.';
  }
  if (s.persisted !== true) {
    return 'The browser may delete Tufa’s data on this device when space runs low or when the app is not used for a while (some phones do this after a week). Install Tufa to the home screen, allow persistent storage below, and sync or export your readings regularly.';
  }
  return undefined;
}

export function formatBytes(n: number | undefined, locale: string | undefined): string {
  if (n === undefined) return 'unknown';
  const units = ['B', 'kB', 'MB', 'GB', 'TB'];
  let i = 0;
  let v = n;
  while (v >= 1000 && i < units.length - 1) {
    v /= 1000;
    i++;
  }
  return `${new Intl.NumberFormat(locale || undefined, { maximumSignificantDigits: 3 }).format(v)} ${units[i]}`;
}
