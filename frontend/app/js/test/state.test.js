import { test } from 'node:test';
import assert from 'node:assert/strict';
import { parseState, toSearch, withChanges, apiQuery, extrasOf } from '../state.js';

test('a full state survives the round trip through the query string', () => {
  const state = {
    screen: 'pages', site: 12, from: '2026-03-01', to: '2026-03-28',
    filters: { device: ['phone', 'tablet'], country: ['PT'], variant: ['<img src=x onerror=alert(1)>', 'B & C'] },
    compare: true,
    extras: { sort: 'bounceRate', order: 'asc', q: 'recipes/ä?x=1&y', minSessions: '50', limit: '50' },
    tables: ['pages'],
  };
  const search = toSearch(state);
  assert.deepEqual(parseState(search), state);
  assert.equal(toSearch(parseState('?' + search)), search);
});

test('the canonical query string has a fixed order and leaves defaults out', () => {
  const s = parseState('compare=previous&site=3&screen=health&to=2026-01-31&from=2026-01-01&device=phone&metric=sessions');
  assert.equal(toSearch(s), 'screen=health&site=3&from=2026-01-01&to=2026-01-31&device=phone&compare=previous');
});

test('every screen round-trips with its defaults', () => {
  for (const screen of ['sites', 'health', 'density', 'depth', 'engagement', 'pages', 'geography']) {
    const s = { screen, site: screen === 'sites' ? null : 1, from: null, to: null, filters: {}, compare: false,
      extras: extrasOf(screen), tables: [] };
    assert.deepEqual(parseState(toSearch(s)), s, screen);
  }
});

test('malformed and unknown parameters are dropped, not trusted', () => {
  const s = parseState('?screen=admin&site=-4&from=2026-02-30&to=yesterday&device=&metric=drop%20table&grain=week'
    + '&continue&tables=a,B,<x>');
  assert.equal(s.screen, 'sites');
  assert.equal(s.site, null);
  assert.equal(s.from, null);
  assert.equal(s.to, null);
  assert.deepEqual(s.filters, {});
  assert.deepEqual(s.tables, ['a']);
  const h = parseState('screen=health&site=2&metric=nonsense&grain=week');
  assert.deepEqual(h.extras, { metric: 'sessions', grain: 'day' });
});

test('a site without a screen opens its health screen; country codes are upper-cased and deduplicated', () => {
  const s = parseState('site=7&country=pt&country=PT&country=es');
  assert.equal(s.screen, 'health');
  assert.deepEqual(s.filters.country, ['PT', 'ES']);
});

test('changing screen resets the screen parameters, changing extras merges them', () => {
  const s = parseState('screen=pages&site=1&sort=bounceRate&tables=pages');
  const g = withChanges(s, { screen: 'geography' });
  assert.deepEqual(g.extras, { by: 'country', sort: 'sessions', order: 'desc' });
  assert.deepEqual(g.tables, []);
  assert.equal(withChanges(s, { extras: { order: 'asc' } }).extras.sort, 'bounceRate');
});

test('the API query carries the range, repeated filters, compare and extras', () => {
  const s = parseState('screen=density&site=1&from=2026-01-01&to=2026-01-28&variant=A&variant=B&compare=previous');
  assert.equal(apiQuery(s, { model: '' }), 'from=2026-01-01&to=2026-01-28&variant=A&variant=B&compare=previous');
  assert.equal(s.extras.model, 'logistic');
  assert.equal(toSearch({ ...s, extras: { model: 'linear' } }).endsWith('&model=linear'), true);
  assert.equal(apiQuery(s, { limit: 20 }, { compare: false }), 'from=2026-01-01&to=2026-01-28&variant=A&variant=B&limit=20');
});
