/**
 * "Signed in as anna · member — what a member may do": the role the server gives this user
 * (`GET /_session`), so what the server will refuse is said before the user tries it.
 */

import { useEffect, useState } from 'preact/hooks';
import type { SyncStatus } from '../../sync/sync-engine';
import type { ConnectionSettings, SyncService } from '../../sync/sync-service';
import { ROLE_WORDS, type TeamIdentity, whoAmI } from '../../team/roles';

export function TeamRole({
  connection,
  status,
}: {
  connection: ConnectionSettings | undefined;
  status?: SyncStatus;
}) {
  const [who, setWho] = useState<TeamIdentity>();
  const synced = status?.lastSyncAt;
  useEffect(() => {
    if (!connection?.url || connection.auth === 'none') {
      setWho(undefined);
      return;
    }
    const url = connection.url.endsWith('/') ? connection.url : `${connection.url}/`;
    let live = true;
    whoAmI(url, { kind: connection.auth, user: connection.user, password: connection.password }).then(
      (w) => live && setWho(w),
    );
    return () => {
      live = false;
    };
  }, [connection?.url, connection?.user, connection?.auth, synced]);
  if (!who) return null;
  return (
    <p class="team-role" data-role={who.role ?? 'none'}>
      Signed in as <strong>{who.name}</strong>
      {who.role ? (
        <>
          {' '}
          · {who.role === 'admin' ? 'server admin' : who.role}: {ROLE_WORDS[who.role]}.
        </>
      ) : (
        ' · no Tufa role on this server: ask the person who runs it to add you (tufa team add-user).'
      )}
    </p>
  );
}

let cached: { key: string; who: TeamIdentity | undefined } | undefined;

/** Who this device is signed in as on its team server (asked once per connection, then cached). */
export function useTeamIdentity(sync: SyncService | undefined): TeamIdentity | undefined {
  const [who, setWho] = useState<TeamIdentity | undefined>(cached?.who);
  useEffect(() => {
    if (!sync) return;
    let live = true;
    sync.connection().then(async (c) => {
      if (!c?.url || c.auth === 'none') return live && setWho(undefined);
      const key = `${c.url}|${c.user}`;
      if (cached?.key !== key) {
        const url = c.url.endsWith('/') ? c.url : `${c.url}/`;
        cached = { key, who: await whoAmI(url, { kind: c.auth, user: c.user, password: c.password }) };
      }
      if (live) setWho(cached.who);
    });
    return () => {
      live = false;
    };
  }, [sync]);
  return who;
}
