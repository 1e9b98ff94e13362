/** Which inputs the engine used for a reading and where each came from (typed, titration, site, settings). */

import type { InputSource, ReadingRequest } from '../../reading/request';
import { useApp } from '../app-context';
import { formatNumber } from '../numbers';

const SOURCE_WORDS: Record<InputSource, string> = {
  typed: 'typed',
  titration: 'from the titration',
  'site default': 'site default',
  settings: 'from Settings',
};

export function InputsUsed(props: { request: Pick<ReadingRequest, 'input' | 'sources'> }) {
  const { locale } = useApp();
  const rows = Object.entries(props.request.sources);
  return (
    <details class="inputs-used" data-testid="inputs-used">
      <summary>Inputs used and where they came from</summary>
      <table class="kv">
        <caption class="sr-only">Engine inputs of this reading with their source</caption>
        <tbody>
          {rows.map(([key, source]) => {
            const v = props.request.input[key];
            return (
              <tr key={key} data-key={key} data-source={source}>
                <th scope="row">{key.replace(/_/g, ' ')}</th>
                <td>{typeof v === 'number' ? formatNumber(v, locale, { digits: 6 }) : String(v)}</td>
                <td>{SOURCE_WORDS[source]}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </details>
  );
}
