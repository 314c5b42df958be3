// A screen's whole state in the query string, so a link reproduces the view. Pure: no DOM.

import { isIsoDate, PRESETS, presetRange } from './range.js';
import { METRIC_NAMES } from './metrics.js';

export const SCREENS = ['sites', 'health', 'density', 'depth', 'engagement', 'pages', 'geography', 'views',
  'alerts', 'imports', 'settings', 'fit', 'account', 'admin'];
export const ANALYSIS = SCREENS.slice(1, 7);
export const SITE_SCREENS = SCREENS.slice(1, 11);
export const FILTERS = ['device', 'source', 'country', 'region', 'browser', 'variant'];
export const DEVICES = ['desktop', 'phone', 'tablet', 'other'];
export const SOURCES = ['search', 'social', 'direct', 'referral', 'email', 'paid', 'other'];

const ORDER = ['desc', ['desc', 'asc']];
const EXTRAS = {
  health: { metric: ['sessions', METRIC_NAMES], grain: ['day', ['day', 'hour']] },
  density: { model: ['logistic', ['logistic', 'linear']] },
  pages: {
    sort: ['sessions', ['sessions', 'bounceRate', 'sessionRpm']], order: ORDER,
    q: ['', /^.{0,200}$/s], minSessions: ['', /^[1-9]\d{0,6}$/], limit: ['20', ['10', '20', '50', '100']],
  },
  geography: { by: ['country', ['country', 'region']], sort: ['sessions', ['sessions', 'pageRpm', 'sessionRpm']],
    order: ORDER },
};
const extraRules = (screen) => Object.entries(EXTRAS[screen] ?? {});

export const extrasOf = (screen) => Object.fromEntries(extraRules(screen).map(([k, [d]]) => [k, d]));

export function parseState(search) {
  const p = new URLSearchParams(search);
  const site = /^[1-9]\d{0,17}$/.test(p.get('site')) ? +p.get('site') : null;
  let screen = p.get('screen');
  if (!SCREENS.includes(screen)) screen = site ? 'health' : 'sites';
  const filters = {};
  for (const f of FILTERS) {
    const values = [];
    for (let v of p.getAll(f)) {
      v = v.trim();
      if (f === 'country' || f === 'region') v = v.toUpperCase();
      if (v && v.length <= 64 && !values.includes(v)) values.push(v);
    }
    if (values.length) filters[f] = values;
  }
  const extras = {};
  for (const [k, [d, rule]] of extraRules(screen)) {
    const v = p.get(k);
    extras[k] = v !== null && (rule.test?.(v) ?? rule.includes(v)) ? v : d;
  }
  // a relative range ("last 90 days") wins over dates: a saved view stays relative
  const range = PRESETS.some((r) => r.id === p.get('range')) ? p.get('range') : null;
  const date = (k) => (!range && isIsoDate(p.get(k)) ? p.get(k) : null);
  return {
    screen, site, range, from: date('from'), to: date('to'), filters,
    compare: p.get('compare') === 'previous',
    extras,
    tables: [...new Set((p.get('tables') ?? '').split(',').filter((t) => /^[a-z][a-z-]{0,30}$/.test(t)))].sort(),
  };
}

export function toSearch(state) {
  const p = new URLSearchParams({ screen: state.screen });
  if (state.site) p.set('site', state.site);
  segment(p, state, state.range);
  if (state.compare) p.set('compare', 'previous');
  for (const [k, [d]] of extraRules(state.screen)) {
    const v = state.extras?.[k];
    if (v != null && v !== d) p.set(k, v);
  }
  if (state.tables?.length) p.set('tables', [...state.tables].sort());
  return p.toString();
}

function segment(p, state, range) {
  if (range) p.set('range', range);
  else for (const k of ['from', 'to']) if (state[k]) p.set(k, state[k]);
  for (const f of FILTERS) for (const v of state.filters?.[f] ?? []) p.append(f, v);
}

export const resolveRange = (state, today) => (state.range ? { ...state, ...presetRange(state.range, today) } : state);

export function viewState(state) {
  const p = new URLSearchParams(toSearch(state));
  p.delete('screen');
  p.delete('site');
  return p.toString();
}

export function withChanges(state, changes) {
  const next = { ...state, ...changes };
  if (changes.screen && changes.screen !== state.screen) {
    next.extras = { ...extrasOf(changes.screen), ...changes.extras };
    next.tables = changes.tables ?? [];
  } else if (changes.extras) {
    next.extras = { ...state.extras, ...changes.extras };
  }
  return next;
}

export function apiQuery(state, extras = {}, { compare = state.compare } = {}) {
  const p = new URLSearchParams();
  segment(p, state);
  if (compare) p.set('compare', 'previous');
  for (const [k, v] of Object.entries(extras)) if (v !== '' && v != null) p.set(k, v);
  return p.toString();
}
