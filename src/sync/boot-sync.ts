/**
 * One call for the app at start-up: sync over the app's repository, with the automatic triggers
 * (open online, network back, Background Sync message). Pass the returned service to `SyncPanel`.
 */

import type { Repository } from '../store/repository';
import { RepositoryStore } from './repository-store';
import { SyncService } from './sync-service';
import { startSyncTriggers, type TriggerEnv } from './sync-triggers';

export async function bootSync(
  repo: Repository,
  env?: TriggerEnv,
): Promise<{ service: SyncService; stop: () => void }> {
  const service = new SyncService(new RepositoryStore(repo));
  await service.start();
  const stop = startSyncTriggers(() => service.syncNow(), env);
  return { service, stop };
}
