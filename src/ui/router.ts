/** Hash routes, so the app works from any static host and from the service worker's cache. */

import { useEffect, useState } from 'preact/hooks';

export type Route =
  | { name: 'sites' }
  | { name: 'site-new' }
  | { name: 'site-edit'; siteId: string }
  | { name: 'site'; siteId: string }
  | { name: 'reading-new'; siteId: string }
  | { name: 'reading'; readingId: string }
  | { name: 'reading-edit'; readingId: string }
  | { name: 'settings' };

export function parseRoute(hash: string): Route {
  const parts = hash.replace(/^#\/?/, '').split('/').filter(Boolean).map(decodeURIComponent);
  const [a, b, c] = parts;
  if (a === 'settings') return { name: 'settings' };
  if (a === 'sites' && b === 'new') return { name: 'site-new' };
  if (a === 'site' && b && c === 'edit') return { name: 'site-edit', siteId: b };
  if (a === 'site' && b && c === 'new-reading') return { name: 'reading-new', siteId: b };
  if (a === 'site' && b) return { name: 'site', siteId: b };
  if (a === 'reading' && b && c === 'edit') return { name: 'reading-edit', readingId: b };
  if (a === 'reading' && b) return { name: 'reading', readingId: b };
  return { name: 'sites' };
}

export function href(route: Route): string {
  switch (route.name) {
    case 'sites':
      return '#/';
    case 'site-new':
      return '#/sites/new';
    case 'site-edit':
      return `#/site/${encodeURIComponent(route.siteId)}/edit`;
    case 'site':
      return `#/site/${encodeURIComponent(route.siteId)}`;
    case 'reading-new':
      return `#/site/${encodeURIComponent(route.siteId)}/new-reading`;
    case 'reading':
      return `#/reading/${encodeURIComponent(route.readingId)}`;
    case 'reading-edit':
      return `#/reading/${encodeURIComponent(route.readingId)}/edit`;
    case 'settings':
      return '#/settings';
  }
}

export function go(route: Route): void {
  location.hash = href(route);
}

export function useRoute(): Route {
  const [route, setRoute] = useState(() => parseRoute(location.hash));
  useEffect(() => {
    const on = () => setRoute(parseRoute(location.hash));
    addEventListener('hashchange', on);
    return () => removeEventListener('hashchange', on);
  }, []);
  return route;
}
