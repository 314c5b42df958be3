// Engagement: what a pageview earns by how long it was read.

import { heading, showScope, metrics, previous, emptyMessage } from '../screen.js';
import { COLORS, alpha } from '../charts.js';

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
      { key: 'pageviews', label: 'Pageviews', num: true, format: fmt.count },
      { key: 'revenuePerPageview', label: `Revenue per pageview (${fmt.currency})`, num: true, format: fmt.money },
      { key: 'pageRpm', label: `Page RPM (${fmt.currency})`, num: true, format: fmt.money },
    ],
  });
  ctx.main.append(panel.el);
  let answer;
  let before;
  try {
    [answer, before] = await Promise.all([metrics(ctx, 'engagement'), previous(ctx, 'engagement')]);
  } catch (e) {
    if (e.name === 'AbortError') throw e;
    panel.error(e);
    return;
  }
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
  if (answer.notice) notes.push(answer.notice[0].toUpperCase() + answer.notice.slice(1) + '.');
  const datasets = [
    { type: 'bar', label: 'Page RPM', data: points.map((p) => p.pageRpm), backgroundColor: alpha(COLORS.green, 0.8),
      yAxisID: 'y' },
    { type: 'line', label: 'Pageviews', data: points.map((p) => p.pageviews), borderColor: COLORS.purple, pointRadius: 3,
      yAxisID: 'y1' },
  ];
  if (before) {
    const prev = new Map(before.points.map((p) => [p.bucket, p.pageRpm]));
    datasets.push({ type: 'line', label: 'Page RPM, previous period', borderColor: COLORS.muted, borderDash: [6, 4],
      pointRadius: 2, data: points.map((p) => prev.get(p.bucket) ?? null), yAxisID: 'y' });
  }
  panel.show(points, {
    data: { labels: points.map((p) => p.label), datasets },
    options: {
      scales: {
        x: { title: { display: true, text: 'Engaged time on the page' } },
        y: { title: { display: true, text: 'Page RPM' }, beginAtZero: true, ticks: { callback: (v) => fmt.money(v) } },
        y1: { position: 'right', grid: { drawOnChartArea: false }, beginAtZero: true,
          title: { display: true, text: 'Pageviews' }, ticks: { callback: (v) => fmt.count(v) } },
      },
      plugins: { tooltip: { callbacks: { label: (c) => (c.dataset.yAxisID === 'y1' ? `${fmt.count(c.parsed.y)} pageviews`
        : `${c.dataset.label}: ${fmt.money(c.parsed.y)}`) } } },
    },
  }, { note: notes.join(' '), label: `Page RPM for ${points.length} engaged-time bands` });
}
