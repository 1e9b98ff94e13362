/** Page for the data panel test: an empty device with the panel mounted. */

import { render } from 'preact';
import { openRepository } from '../../src/store/repository';
import { DataPanel } from '../../src/ui/data/DataPanel';

declare global {
  interface Window {
    panelReady?: boolean;
  }
}

openRepository({ name: 'tufa-data-panel' }).then((repo) => {
  render(<DataPanel repo={repo} />, document.getElementById('app')!);
  window.panelReady = true;
});
