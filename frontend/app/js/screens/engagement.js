// Engagement: what a pageview earns by how long it was read.

import { h } from '../dom.js';
import { heading, showScope, load, emptyMessage, withPrevious } from '../screen.js';
import { COLORS, barsAndLine } from '../charts.js';
import { kneeOf, sentence } from '../verdict.js';

export const id = 'engagement';
export const title = 'Engagement';

export async function render(ctx) {
  const { fmt } = ctx;
  const scope = heading(ctx, 'Engagement and revenue', 'What a pageview earns by its engaged time (in view, reader '
    + 'active).');
  const panel = ctx.panel({
    id: 'engaged', title: 'Revenue per 1,000 pageviews by engaged time',
    caption: 'Bars: page RPM of pageviews read that long. Line: how many pageviews fall in each band.'
      + (ctx.state.compare ? ' Grey dashed: page RPM in the previous period.' : ''),
    columns: [['label', 'Engaged time'], ['pageviews', 'Pageviews', 'count'],
      ['revenuePerPageview', 'Revenue per pageview', 'money'], ['pageRpm', 'Page RPM', 'money'],
      ...(ctx.state.compare ? [['previous', 'Previous period, page RPM', 'money']] : [])],
  });
  const knee = h('p.knee#engagement-knee');
  ctx.main.append(knee, panel.el);
  const [answer, prev] = await load(ctx, 'engagement', {}, [panel]) ?? [];
  if (!answer) return;
  showScope(ctx, scope, answer.scope);
  const { points, unmeasuredPageviews: unmeasured } = answer;
  if (!points.length) return panel.empty(emptyMessage('pageviews with engaged time', answer.notice));
  const all = answer.pageviews + unmeasured;
  const note = (unmeasured ? `${fmt.count(unmeasured)} of ${fmt.count(all)} pageviews `
    + `(${fmt.percent(unmeasured / all)}) have no measured engaged time and are left out. ` : '')
    + sentence(answer.notice);
  const k = kneeOf(answer.fit, answer.notice, (x) => `past about ${fmt.duration(x * 1000)} of engaged time, a pageview `
    + 'earns little more');
  knee.textContent = k.text;
  knee.classList.toggle('found', k.x !== null);
  const ms = k.x * 1000;
  const kneeAt = k.x === null ? -1 : points.findIndex((p) => ms >= p.lowerMs && (p.upperMs == null || ms < p.upperMs));
  panel.show(points, barsAndLine({
    labels: points.map((p) => p.label), xTitle: 'Engaged time on the page',
    extra: withPrevious(points, prev, 'pageRpm'),
    lines: kneeAt >= 0 ? [{ x: kneeAt, color: COLORS.vermillion, label: `knee ≈ ${fmt.duration(ms)}` }] : [],
    bar: { label: 'Page RPM', data: points.map((p) => p.pageRpm), color: COLORS.green + 'cc', format: fmt.money },
    line: { label: 'Pageviews', data: points.map((p) => p.pageviews), color: COLORS.purple, format: fmt.count },
  }), { note, label: `Page RPM for ${points.length} engaged-time bands` });
}
