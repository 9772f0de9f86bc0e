import { useEffect, useState } from 'react';

/** The app's places, kept in the URL hash so a reload (or a deep link) returns to the same one. */
export type Route =
  | { screen: 'home' }
  | { screen: 'experiment'; id: string; tab: ExperimentTab }
  | { screen: 'plate'; experimentId: string; plateId: string };

export type ExperimentTab = 'assays' | 'results' | 'data';

export function parseRoute(hash: string): Route {
  const parts = hash.replace(/^#\/?/, '').split('/').filter(Boolean).map(decodeURIComponent);
  if (parts[0] === 'x' && parts[1]) {
    if (parts[2] === 'plate' && parts[3])
      return { screen: 'plate', experimentId: parts[1], plateId: parts[3] };
    const tab = parts[2] === 'results' || parts[2] === 'data' ? parts[2] : 'assays';
    return { screen: 'experiment', id: parts[1], tab };
  }
  return { screen: 'home' };
}

export function hrefOf(route: Route): string {
  switch (route.screen) {
    case 'home':
      return '#/';
    case 'experiment':
      return `#/x/${encodeURIComponent(route.id)}/${route.tab}`;
    case 'plate':
      return `#/x/${encodeURIComponent(route.experimentId)}/plate/${encodeURIComponent(route.plateId)}`;
  }
}

export function go(route: Route): void {
  window.location.hash = hrefOf(route);
}

export function useRoute(): Route {
  const [route, setRoute] = useState(() => parseRoute(window.location.hash));
  useEffect(() => {
    const onChange = () => setRoute(parseRoute(window.location.hash));
    window.addEventListener('hashchange', onChange);
    return () => window.removeEventListener('hashchange', onChange);
  }, []);
  return route;
}
