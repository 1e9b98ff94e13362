/**
 * "Signed in as anna · member — what a member may do": the role the server gives this user
 * (`GET /_session`), so what the server will refuse is said before the user tries it.
 */

import { useEffect, useState } from 'preact/hooks';
import type { SyncStatus } from '../../sync/sync-engine';
import type { ConnectionSettings } from '../../sync/sync-service';
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
