import { render } from 'preact';

function App() {
  return (
    <main>
      <h1>Tufa</h1>
      <p>Carbonate system of natural waters, offline.</p>
    </main>
  );
}

const root = document.getElementById('app');
if (root) render(<App />, root);
