import { test } from 'node:test';
import assert from 'node:assert/strict';
import { parseState, toSearch, withChanges, apiQuery, extrasOf, resolveRange, viewState, SCREENS } from '../state.js';

test('a full state survives the round trip through the query string', () => {
  const state = {
    screen: 'pages', site: 12, range: null, from: '2026-03-01', to: '2026-03-28',
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
  for (const screen of SCREENS) {
    const s = { screen, site: screen === 'sites' ? null : 1, range: null, from: null, to: null, filters: {}, compare: false,
      extras: extrasOf(screen), tables: [] };
    assert.deepEqual(parseState(toSearch(s)), s, screen);
  }
});

test('malformed and unknown parameters are dropped, not trusted', () => {
  const s = parseState('?screen=root&site=-4&from=2026-02-30&to=yesterday&device=&metric=drop%20table&grain=week'
    + '&continue&tables=a,B,<x>');
  assert.equal(s.screen, 'sites');
  assert.equal(s.site, null);
  assert.equal(s.from, null);
  assert.equal(s.to, null);
  assert.deepEqual(s.filters, {});
  assert.deepEqual(s.tables, ['a']);
  const h = parseState('screen=health&site=2&metric=nonsense&grain=week');
  assert.deepEqual(h.extras, { metric: 'sessions', grain: 'day' });
  assert.equal(parseState('screen=health&site=2&grain=hour').extras.grain, 'hour');
  assert.ok(!toSearch(parseState('screen=health&site=2&grain=day')).includes('grain'), 'defaults stay out of the URL');
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

// Issue #6: a saved view of "the last 90 days" stays relative: the range travels, the dates follow today.
test('a relative range round-trips as range=…, never as dates, and resolves against the site\'s today', () => {
  const s = parseState('?screen=density&site=3&range=90d&device=desktop&from=2026-01-01&to=2026-01-02');
  assert.equal(s.range, '90d');
  assert.equal(s.from, null);
  assert.equal(toSearch(s), 'screen=density&site=3&range=90d&device=desktop');
  const r = resolveRange(s, '2026-03-31');
  assert.deepEqual([r.from, r.to], ['2026-01-01', '2026-03-31']);
  assert.equal(toSearch(r), 'screen=density&site=3&range=90d&device=desktop');
  assert.equal(apiQuery(r), 'from=2026-01-01&to=2026-03-31&device=desktop');
  assert.equal(viewState(r), 'range=90d&device=desktop');
  const later = resolveRange(parseState('?' + toSearch(r)), '2026-04-30');
  assert.deepEqual([later.from, later.to], ['2026-01-31', '2026-04-30']);
  assert.deepEqual(resolveRange(parseState('site=3&range=last-month'), '2026-03-10'),
    { ...parseState('site=3&range=last-month'), from: '2026-02-01', to: '2026-02-28' });
});

test('fixed dates and unknown ranges: dates stay, a range that is not a preset is dropped', () => {
  const s = parseState('screen=health&site=1&range=12d&from=2026-01-01&to=2026-01-28&device=phone');
  assert.equal(s.range, null);
  assert.equal(viewState(s), 'from=2026-01-01&to=2026-01-28&device=phone');
  // choosing custom dates clears the range
  assert.equal(toSearch(withChanges(parseState('site=1&range=7d'), { range: null, from: '2026-01-01', to: '2026-01-02' })),
    'screen=health&site=1&from=2026-01-01&to=2026-01-02');
  assert.equal(viewState(parseState('screen=geography&site=4&sort=sessionRpm')), 'sort=sessionRpm');
});
