/**
 * A change the server refused (`src/sync/refused.ts`), in plain words: the server's reason, this
 * device's version beside the server's (or "not on the server"), and the three choices. Also the
 * list of records the user chose to keep on this device only, each with a way to send it again.
 */

import type { TufaDoc } from '../../store/schema';
import type { RefusedChoice } from '../../sync/refused';
import type { ConflictRecord } from '../../sync/sync-store';
import { differingFields, docTitle, fieldLabel, showValue } from './conflict-fields';

const noun = (d: TufaDoc) => (d.type === 'site' ? 'site' : 'reading');

export function RefusedCard({
  c,
  locale,
  onSettle,
}: {
  c: ConflictRecord;
  locale?: string;
  onSettle: (choice: RefusedChoice) => void;
}) {
  const server = c.others[0]?.doc;
  const title = docTitle(c.local, locale);
  const fields = server ? differingFields([c.local, server]) : [];
  const reason = c.reason?.trim().replace(/\.$/, '');
  return (
    <article class="panel refused" aria-label={`Refused by the server: ${title}`}>
      <h3>{title}</h3>
      <p>
        The server did not accept your change to this {noun(c.local)}
        {reason ? `: ${reason}.` : ', for your role on the team.'}
      </p>
      <p class="muted small">Your version is kept on this device and is not sent again while you decide.</p>
      {server ? (
        fields.length > 0 && (
          <table class="kv conflict">
            <thead>
              <tr>
                <th scope="col">Field</th>
                <th scope="col">This device</th>
                <th scope="col">Server</th>
              </tr>
            </thead>
            <tbody>
              {fields.map((f) => (
                <tr key={f}>
                  <th scope="row">{fieldLabel(f)}</th>
                  {[c.local, server].map((v, i) => (
                    <td key={i === 0 ? 'here' : 'server'}>
                      {showValue(f, (v as unknown as Record<string, unknown>)[f], locale)}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        )
      ) : (
        <p class="muted small">
          Not on the server: it holds no copy of this {noun(c.local)}, so yours is the only one.
        </p>
      )}
      <div class="actions">
        {server && (
          <button type="button" onClick={() => onSettle('server')}>
            Use the server’s version (drops your change)
          </button>
        )}
        <button type="button" onClick={() => onSettle('here')}>
          Keep mine on this device only
        </button>
        <button type="button" class="primary" onClick={() => onSettle('retry')}>
          Try sending again
        </button>
      </div>
    </article>
  );
}

/** Records kept on this device only: not sent, until the user sends them again. */
export function HeldHere({
  docs,
  locale,
  onSend,
}: {
  docs: TufaDoc[];
  locale?: string;
  onSend: (docId: string) => void;
}) {
  if (docs.length === 0) return null;
  return (
    <section class="panel" aria-labelledby="held-h">
      <h3 id="held-h">Kept on this device only ({docs.length})</h3>
      <p class="muted small">
        The server refused these changes and you chose to keep them here. They are not sent; another change to
        one of them, or “Send again”, sends it at the next sync.
      </p>
      <ul class="held">
        {docs.map((d) => (
          <li key={d.id}>
            <span>{docTitle(d, locale)}</span>
            <button type="button" onClick={() => onSend(d.id)}>
              Send again
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}
