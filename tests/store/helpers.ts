import 'fake-indexeddb/auto';
import { openRepository, type Repository, type RepositoryOptions } from '../../src/store/repository';

let n = 0;
/** A repository over a fresh fake-indexeddb database with a controllable clock. */
export async function freshRepo(
  opts: RepositoryOptions = {},
): Promise<{ repo: Repository; name: string; tick: (ms?: number) => void }> {
  const name = `tufa-test-${process.pid}-${n++}`;
  let t = Date.parse('2026-05-01T08:00:00Z');
  let ids = 0;
  const repo = await openRepository({ name, now: () => new Date(t), newId: () => `id-${++ids}`, ...opts });
  return {
    repo,
    name,
    tick: (ms = 1000) => {
      t += ms;
    },
  };
}
