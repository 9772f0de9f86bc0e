import { describe, expect, it } from 'vitest';
import { hrefOf, parseRoute, type Route } from './route.ts';

describe('places in the URL hash', () => {
  it.each<Route>([
    { screen: 'home' },
    { screen: 'experiment', id: 'e 1/ä', tab: 'assays' },
    { screen: 'experiment', id: 'abc', tab: 'results' },
    { screen: 'experiment', id: 'abc', tab: 'data' },
    { screen: 'plate', experimentId: 'abc', plateId: 'p#9' },
  ])('%j round-trips', (route) => {
    expect(parseRoute(hrefOf(route))).toEqual(route);
  });

  it('anything else is the start screen, and an unknown tab is the bench', () => {
    expect(parseRoute('')).toEqual({ screen: 'home' });
    expect(parseRoute('#/nowhere/1')).toEqual({ screen: 'home' });
    expect(parseRoute('#/x/abc/elsewhere')).toEqual({
      screen: 'experiment',
      id: 'abc',
      tab: 'assays',
    });
  });
});
