// A screen's whole state in the query string, so a link reproduces the view. Pure: no DOM.

import { isIsoDate } from './range.js';
import { METRIC_NAMES } from './metrics.js';

export const SCREENS = ['sites', 'health', 'density', 'depth', 'engagement', 'pages', 'geography'];
export const FILTERS = ['device', 'source', 'country', 'region', 'browser', 'variant'];
export const DEVICES = ['desktop', 'phone', 'tablet', 'other'];
export const SOURCES = ['search', 'social', 'direct', 'referral', 'email', 'paid', 'other'];

/** Screen-specific parameters: default and accepted values (a RegExp for free values). */
const EXTRAS = {
  health: { metric: ['sessions', METRIC_NAMES], grain: ['day', ['day', 'hour']] },
  density: { model: ['logistic', ['logistic', 'linear']] },
  pages: {
    sort: ['sessions', ['sessions', 'bounceRate', 'sessionRpm']], order: ['desc', ['desc', 'asc']],
    q: ['', /^.{0,200}$/s], minSessions: ['', /^[1-9]\d{0,6}$/], limit: ['20', ['10', '20', '50', '100']],
  },
  geography: {
    by: ['country', ['country', 'region']], sort: ['sessions', ['sessions', 'pageRpm', 'sessionRpm']],
    order: ['desc', ['desc', 'asc']],
  },
};

export function extrasOf(screen) {
  return Object.fromEntries(Object.entries(EXTRAS[screen] ?? {}).map(([k, [d]]) => [k, d]));
}

function accepts(rule, value) {
  return rule instanceof RegExp ? rule.test(value) : rule.includes(value);
}

function cleanFilter(name, values) {
  const out = [];
  for (let v of values) {
    v = String(v).trim();
    if (name === 'country' || name === 'region') v = v.toUpperCase();
    if (v && v.length <= 64 && !out.includes(v)) out.push(v);
  }
  return out;
}

/** A state from a query string ("?a=b…" or "a=b…"); unknown or malformed parameters are dropped. */
export function parseState(search) {
  const p = new URLSearchParams(search);
  const siteText = p.get('site');
  const site = /^[1-9]\d{0,17}$/.test(siteText ?? '') ? Number(siteText) : null;
  let screen = p.get('screen');
  if (!SCREENS.includes(screen)) screen = site ? 'health' : 'sites';
  const filters = {};
  for (const f of FILTERS) {
    const values = cleanFilter(f, p.getAll(f));
    if (values.length) filters[f] = values;
  }
  const extras = {};
  for (const [k, [d, rule]] of Object.entries(EXTRAS[screen] ?? {})) {
    const v = p.get(k);
    extras[k] = v !== null && accepts(rule, v) ? v : d;
  }
  const from = p.get('from');
  const to = p.get('to');
  const tables = (p.get('tables') ?? '').split(',').filter((t) => /^[a-z][a-z-]{0,30}$/.test(t));
  return {
    screen,
    site,
    from: isIsoDate(from) ? from : null,
    to: isIsoDate(to) ? to : null,
    filters,
    compare: p.get('compare') === 'previous',
    extras,
    tables: [...new Set(tables)].sort(),
  };
}

/** The canonical query string of a state (fixed order, defaults left out), without the leading "?". */
export function toSearch(state) {
  const p = new URLSearchParams();
  p.set('screen', state.screen);
  if (state.site) p.set('site', String(state.site));
  if (state.from) p.set('from', state.from);
  if (state.to) p.set('to', state.to);
  for (const f of FILTERS) for (const v of state.filters?.[f] ?? []) p.append(f, v);
  if (state.compare) p.set('compare', 'previous');
  for (const [k, [d]] of Object.entries(EXTRAS[state.screen] ?? {})) {
    const v = state.extras?.[k];
    if (v !== undefined && v !== null && v !== d) p.set(k, v);
  }
  if (state.tables?.length) p.set('tables', [...state.tables].sort().join(','));
  return p.toString();
}

/** The state with some fields replaced; a new screen starts with that screen's default extras. */
export function withChanges(state, changes) {
  const next = { ...state, ...changes };
  if (changes.screen && changes.screen !== state.screen) {
    next.extras = { ...extrasOf(changes.screen), ...(changes.extras ?? {}) };
    next.tables = changes.tables ?? [];
  } else if (changes.extras) {
    next.extras = { ...state.extras, ...changes.extras };
  }
  return next;
}

/** The API query for a metrics answer: range, segment filters and compare, plus the given extras. */
export function apiQuery(state, extras = {}, { compare = state.compare } = {}) {
  const p = new URLSearchParams();
  if (state.from) p.set('from', state.from);
  if (state.to) p.set('to', state.to);
  for (const f of FILTERS) for (const v of state.filters?.[f] ?? []) p.append(f, v);
  if (compare) p.set('compare', 'previous');
  for (const [k, v] of Object.entries(extras)) if (v !== '' && v !== null && v !== undefined) p.set(k, String(v));
  return p.toString();
}
