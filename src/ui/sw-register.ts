/**
 * Registers the service worker and reports when a new version is waiting. The new version takes
 * over only when the user says so (no silent skipWaiting: a half-typed reading must not vanish in
 * a reload).
 */

export function registerServiceWorker(onUpdateReady: (apply: () => void) => void): void {
  if (!('serviceWorker' in navigator) || import.meta.env.DEV) return;
  const url = `${import.meta.env.BASE_URL}sw.js`;
  navigator.serviceWorker
    .register(url, { scope: import.meta.env.BASE_URL })
    .then((reg) => {
      const offer = (w: ServiceWorker) =>
        onUpdateReady(() => {
          navigator.serviceWorker.addEventListener('controllerchange', () => location.reload(), {
            once: true,
          });
          w.postMessage({ type: 'SKIP_WAITING' });
        });
      if (reg.waiting && navigator.serviceWorker.controller) offer(reg.waiting);
      reg.addEventListener('updatefound', () => {
        const w = reg.installing;
        w?.addEventListener('statechange', () => {
          // A first install has no controller: nothing to replace, no prompt.
          if (w.state === 'installed' && navigator.serviceWorker.controller) offer(w);
        });
      });
    })
    .catch((e) => console.warn('Service worker registration failed', e));
}
