// What every screen has: its heading, the line saying which data it shows, and the metrics request.

import { h } from './dom.js';
import { apiQuery } from './state.js';
import { previousRange } from './range.js';

const FILTER_WORDS = { device: 'Device', source: 'Source', country: 'Country', region: 'Region', browser: 'Browser',
  variant: 'Variant' };

/** Heading and introduction; returns the (empty) scope line. */
export function heading(ctx, title, intro) {
  const scope = h('p', { class: 'scope', id: 'scope' });
  ctx.main.append(h('div', { class: 'screen-head' },
    h('h1', { id: 'screen-title', tabindex: '-1', text: title }),
    intro ? h('p', { class: 'intro', text: intro }) : null,
    scope));
  return scope;
}

/** "1 Mar – 28 Mar 2026 · Variant: B" from an answer's scope (what the server actually answered). */
export function describeScope(ctx, scope, previous) {
  const parts = [ctx.fmt.range(scope.from, scope.to)];
  for (const [k, values] of Object.entries(scope.filters ?? {})) parts.push(`${FILTER_WORDS[k] ?? k}: ${values.join(', ')}`);
  if (previous) parts.push('compared with ' + ctx.fmt.range(previous.from, previous.to));
  return parts.join(' · ');
}

export function showScope(ctx, el, scope, previous) {
  el.replaceChildren(h('span', { class: 'scope-text', text: describeScope(ctx, scope, previous) }));
  if (scope.answeredFrom) el.title = 'Read from ' + scope.answeredFrom;
}

/** GET a metrics answer for the segment; opts.range ({from, to}) for other dates. */
export function metrics(ctx, name, extras = {}, opts = {}) {
  return ctx.api.get(`/api/v1/sites/${ctx.site.id}/metrics/${name}`,
    apiQuery({ ...ctx.state, ...(opts.range ?? {}) }, extras, opts), ctx.signal);
}

/** The previous period's answer when comparing, else null. */
export function previous(ctx, name, extras = {}) {
  if (!ctx.state.compare) return Promise.resolve(null);
  return metrics(ctx, name, extras, { compare: false, range: previousRange(ctx.state.from, ctx.state.to) })
    .catch((e) => (e.name === 'AbortError' ? Promise.reject(e) : null));
}

/** [answer, previous period's answer or null]; null after showing a failure in the panels. */
export async function load(ctx, name, extras, panels, previousExtras = extras) {
  try {
    return await Promise.all([metrics(ctx, name, extras), previous(ctx, name, previousExtras)]);
  } catch (e) {
    if (e.name === 'AbortError') throw e;
    for (const p of panels) p.error(e);
    return null;
  }
}

/** An empty-state sentence: what is missing and what to try. */
export function emptyMessage(what, notice) {
  return (notice ? notice[0].toUpperCase() + notice.slice(1) + '. ' : `No ${what} in this segment and date range. `)
    + 'Widen the date range or remove a reader filter.';
}
