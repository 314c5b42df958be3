// Engagement: what a pageview earns by how long it was read.

import { h } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
import { COLORS, alpha, barsAndLine } from '../charts.js';
import { kneeOf, sentence } from '../verdict.js';

export const id = 'engagement';
export const title = 'Engagement';

export async function render(ctx) {
  const { fmt } = ctx;
  const scope = heading(ctx, 'Engagement and revenue', 'What a pageview earns by its engaged time (time in view '
    + 'with the reader active).');
  const panel = ctx.panel({
    id: 'engaged', title: 'Revenue per 1,000 pageviews by engaged time',
    caption: 'Bars: page RPM, the revenue per 1,000 pageviews (revenue per pageview × 1,000) of pageviews read that '
      + 'long. Line: how many pageviews fall in each band.',
    columns: [
      { key: 'label', label: 'Engaged time' },
      { key: 'pageviews', label: 'Pageviews', format: fmt.count },
      { key: 'revenuePerPageview', label: `Revenue per pageview (${fmt.currency})`, format: fmt.money },
      { key: 'pageRpm', label: `Page RPM (${fmt.currency})`, format: fmt.money },
    ],
  });
  const knee = h('p', { class: 'knee', id: 'engagement-knee' });
  ctx.main.append(knee, panel.el);
  const loaded = await load(ctx, 'engagement', {}, [panel]);
  if (!loaded) return;
  const [answer, before] = loaded;
  showScope(ctx, scope, answer.scope, before?.scope);
  const points = answer.points;
  if (!points.length) {
    panel.empty(emptyMessage('pageviews with engaged time', answer.notice));
    return;
  }
  const all = answer.pageviews + answer.unmeasuredPageviews;
  const notes = [];
  if (answer.unmeasuredPageviews) {
    notes.push(`${fmt.count(answer.unmeasuredPageviews)} of ${fmt.count(all)} pageviews `
      + `(${fmt.percent(answer.unmeasuredPageviews / all)}) have no measured engaged time and are left out.`);
  }
  if (answer.notice) notes.push(sentence(answer.notice));
  const k = kneeOf(answer.fit, answer.notice, (x) => `past about ${fmt.duration(x * 1000)} of engaged time, a pageview `
    + 'earns little more');
  knee.textContent = k.text;
  knee.classList.toggle('found', k.x !== null);
  const kneeAt = k.x !== null ? points.findIndex((p) => k.x * 1000 >= p.lowerMs && (p.upperMs === undefined
    || p.upperMs === null || k.x * 1000 < p.upperMs)) : -1;
  const extra = [];
  if (before) {
    const prev = new Map(before.points.map((p) => [p.bucket, p.pageRpm]));
    extra.push({ type: 'line', label: 'Page RPM, previous period', borderColor: COLORS.muted, borderDash: [6, 4],
      pointRadius: 2, data: points.map((p) => prev.get(p.bucket) ?? null) });
  }
  panel.show(points, barsAndLine({
    labels: points.map((p) => p.label), xTitle: 'Engaged time on the page', extra,
    lines: kneeAt >= 0 ? [{ x: kneeAt, color: COLORS.vermillion, label: `knee ≈ ${fmt.duration(k.x * 1000)}` }] : [],
    bar: { label: 'Page RPM', data: points.map((p) => p.pageRpm), color: alpha(COLORS.green, 0.8), format: fmt.money },
    line: { label: 'Pageviews', data: points.map((p) => p.pageviews), color: COLORS.purple, format: fmt.count },
  }), { note: notes.join(' '), label: `Page RPM for ${points.length} engaged-time bands` });
}
