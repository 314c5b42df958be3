// What every screen has: its heading, the line saying which data it shows, and the metrics request.

import { h } from './dom.js';
import { apiQuery } from './state.js';
import { previousRange } from './range.js';
import { sentence } from './verdict.js';
import { COLORS } from './charts.js';

/** Heading and introduction; returns the scope line. */
export function heading(ctx, title, intro) {
  const scope = h('p.scope#scope');
  ctx.main.append(h('h1#screen-title', { text: title, tabindex: '-1' }), h('p.intro', intro), scope);
  return scope;
}

/** "1 Mar – 28 Mar 2026 · Variant: B" from an answer's scope (what the server actually answered). */
export function showScope({ fmt }, el, scope, previous) {
  el.replaceChildren(h('span.scope-text', [fmt.range(scope.from, scope.to),
    ...Object.entries(scope.filters ?? {}).map(([k, v]) => `${k[0].toUpperCase() + k.slice(1)}: ${v.join(', ')}`),
    previous && 'compared with ' + fmt.range(previous.from, previous.to)].filter(Boolean).join(' · ')));
  if (scope.answeredFrom) el.title = 'Read from ' + scope.answeredFrom;
}

export const metrics = (ctx, name, extras = {}, opts = {}) => ctx.api.get(
  `/api/v1/sites/${ctx.site.id}/metrics/${name}`, apiQuery({ ...ctx.state, ...opts.range }, extras, opts), ctx.signal);

const rethrowAbort = (e) => {
  if (e.name === 'AbortError') throw e;
  return null;
};

/** [answer, the previous period's or null]; null after showing a failure in the panels. */
export function load(ctx, name, extras, panels, previousExtras = extras) {
  const { compare, from, to } = ctx.state;
  return Promise.all([metrics(ctx, name, extras), compare && previousExtras ? metrics(ctx, name, previousExtras,
    { compare: false, range: previousRange(from, to) }).catch(rethrowAbort) : null]).catch((e) => {
    rethrowAbort(e);
    panels.forEach((p) => p.error(e));
  });
}

export const emptyMessage = (what, notice) => (notice ? sentence(notice) : `No ${what} in this segment and dates.`)
  + ' Widen the dates or remove a reader filter.';

/**
 * With "compare" on: each point gains `previous`, the previous period's `key` at the same label, and the chart a
 * grey dashed line of it on the bar axis. Returns the extra datasets (none without a previous answer).
 */
export function withPrevious(points, prev, key) {
  if (!prev) return [];
  for (const p of points) p.previous = prev.points.find((q) => q.label === p.label)?.[key] ?? null;
  return [{ type: 'line', label: 'Previous period', data: points.map((p) => p.previous), borderColor: COLORS.muted,
    backgroundColor: COLORS.muted, borderDash: [6, 4], pointRadius: 2, borderWidth: 1.5 }];
}
