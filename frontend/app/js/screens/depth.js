// Reading depth: revenue per session by pages per session, the value of the n-th page, and the knee.

import { h } from '../dom.js';
import { heading, showScope, metrics, previous, emptyMessage } from '../screen.js';
import { COLORS, alpha } from '../charts.js';
import { num } from '../verdict.js';

export const id = 'depth';
export const title = 'Reading depth';

/** The knee of the depth curve if the answer has one (fit.knee, fit.kneeX or a breakpoint), else null. */
export function kneeOf(fit) {
  if (!fit || typeof fit !== 'object') return null;
  return num(fit.knee?.x) ?? num(fit.knee?.kneeX) ?? num(fit.knee) ?? num(fit.kneeX) ?? num(fit.breakpoints?.[0]?.estimate);
}

export async function render(ctx) {
  const { fmt } = ctx;
  const scope = heading(ctx, 'Reading depth', 'What a session earns by how many pages it reads, and what each '
    + 'further page adds.');
  const money = (v) => fmt.money(v);
  const columns = [
    { key: 'label', label: 'Pages per session' },
    { key: 'sessions', label: 'Sessions', num: true, format: fmt.count },
    { key: 'share', label: 'Share of sessions', num: true, format: (v) => fmt.percent(v) },
    { key: 'revenuePerSession', label: `Revenue per session (${fmt.currency})`, num: true, format: money },
    { key: 'marginalRevenue', label: `Value of this page (${fmt.currency})`, num: true, format: money },
  ];
  const knee = h('p', { class: 'verdict-text', id: 'depth-knee' });
  const curve = ctx.panel({ id: 'revenue', title: 'Revenue per session by pages per session', columns,
    caption: 'Bars: what a session of that length earned on average. Line: the share of sessions of that length, so '
      + 'thin lengths show as thin. The last bar counts 11 pages or more.' });
  const marginal = ctx.panel({ id: 'marginal', title: 'What the n-th page adds', columns,
    caption: 'Revenue per session of n pages minus that of n − 1 pages: the value of reading one page further. '
      + 'Blue adds, orange loses.' });
  ctx.main.append(knee, curve.el, marginal.el);

  let answer;
  let before;
  try {
    [answer, before] = await Promise.all([metrics(ctx, 'depth'), previous(ctx, 'depth')]);
  } catch (e) {
    if (e.name === 'AbortError') throw e;
    curve.error(e);
    marginal.error(e);
    return;
  }
  showScope(ctx, scope, answer.scope, before?.scope);
  const points = answer.points;
  if (!points.length) {
    curve.empty(emptyMessage('sessions', answer.notice));
    marginal.empty(emptyMessage('sessions', answer.notice));
    return;
  }
  const k = kneeOf(answer.fit);
  knee.textContent = k !== null ? `Knee: after about ${fmt.decimal(k, 1)} pages, each further page adds less.`
    : 'The server gave no knee estimate for this answer; read it from where the bars of the lower chart shrink.';
  const labels = points.map((p) => p.label);
  const lines = k !== null ? [{ x: points.findIndex((p) => p.pages >= Math.round(k)), color: COLORS.vermillion,
    label: `knee ≈ ${fmt.decimal(k, 1)} pages` }] : [];
  const note = answer.notice ? answer.notice[0].toUpperCase() + answer.notice.slice(1) + '; read these bars with care.' : '';
  const datasets = [
    { type: 'bar', label: 'Revenue per session', data: points.map((p) => p.revenuePerSession),
      backgroundColor: alpha(COLORS.blue, 0.8), yAxisID: 'y' },
    { type: 'line', label: 'Share of sessions', data: points.map((p) => p.share), borderColor: COLORS.orange,
      pointRadius: 3, yAxisID: 'y1' },
  ];
  if (before) {
    const prev = new Map(before.points.map((p) => [p.pages, p.revenuePerSession]));
    datasets.push({ type: 'line', label: 'Revenue per session, previous period', borderColor: COLORS.muted,
      borderDash: [6, 4], pointRadius: 2, data: points.map((p) => prev.get(p.pages) ?? null), yAxisID: 'y' });
  }
  curve.show(points, {
    data: { labels, datasets },
    options: {
      scales: {
        x: { title: { display: true, text: 'Pages per session' } },
        y: { title: { display: true, text: 'Revenue per session' }, ticks: { callback: money }, beginAtZero: true },
        y1: { position: 'right', grid: { drawOnChartArea: false }, title: { display: true, text: 'Share of sessions' },
          ticks: { callback: (v) => fmt.percent(v, 0) }, beginAtZero: true },
      },
      plugins: { flGuides: { lines }, tooltip: { callbacks: { label: (c) => (c.dataset.yAxisID === 'y1'
        ? `${fmt.percent(c.parsed.y)} of sessions` : `${c.dataset.label}: ${money(c.parsed.y)}`) } } },
    },
  }, { note, label: `Revenue per session for ${points.length} session lengths` });
  marginal.show(points, {
    type: 'bar',
    data: { labels, datasets: [{ label: 'Value of the n-th page', data: points.map((p) => p.marginalRevenue),
      backgroundColor: points.map((p) => ((p.marginalRevenue ?? 0) >= 0 ? alpha(COLORS.blue, 0.8) : alpha(COLORS.orange, 0.9))) }] },
    options: {
      scales: { x: { title: { display: true, text: 'n-th page' } }, y: { ticks: { callback: money } } },
      plugins: { legend: { display: false }, flGuides: { lines },
        tooltip: { callbacks: { label: (c) => `Page ${c.label}: ${money(c.parsed.y)} per session` } } },
    },
  }, { label: `Value of each further page, ${points.length} bars` });
}
