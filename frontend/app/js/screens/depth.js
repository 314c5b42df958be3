// Reading depth: revenue per session by pages per session, the value of the n-th page, and the knee.

import { h } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
import { COLORS, alpha, barsAndLine } from '../charts.js';
import { kneeOf, sentence } from '../verdict.js';

export const id = 'depth';
export const title = 'Reading depth';

export async function render(ctx) {
  const { fmt } = ctx;
  const scope = heading(ctx, 'Reading depth', 'What a session earns by how many pages it reads, and what each '
    + 'further page adds.');
  const money = (v) => fmt.money(v);
  const columns = [
    { key: 'label', label: 'Pages per session' },
    { key: 'sessions', label: 'Sessions', format: fmt.count },
    { key: 'share', label: 'Share of sessions', format: (v) => fmt.percent(v) },
    { key: 'revenuePerSession', label: `Revenue per session (${fmt.currency})`, format: money },
    { key: 'marginalRevenue', label: `Value of this page (${fmt.currency})`, format: money },
  ];
  const knee = h('p', { class: 'knee', id: 'depth-knee' });
  const curve = ctx.panel({ id: 'revenue', title: 'Revenue per session by pages per session', columns,
    caption: 'Bars: what a session of that length earned on average. Line: the share of sessions of that length, so '
      + 'thin lengths show as thin. The last bar counts 11 pages or more.' });
  const marginal = ctx.panel({ id: 'marginal', title: 'What the n-th page adds', columns,
    caption: 'Revenue per session of n pages minus that of n − 1 pages: the value of reading one page further. '
      + 'Blue adds, orange loses.' });
  ctx.main.append(knee, curve.el, marginal.el);

  const loaded = await load(ctx, 'depth', {}, [curve, marginal]);
  if (!loaded) return;
  const [answer, before] = loaded;
  showScope(ctx, scope, answer.scope, before?.scope);
  const points = answer.points;
  if (!points.length) {
    curve.empty(emptyMessage('sessions', answer.notice));
    marginal.empty(emptyMessage('sessions', answer.notice));
    return;
  }
  const k = kneeOf(answer.fit, answer.notice, (x) => `after about ${fmt.decimal(x, 1)} pages, each further page adds less`);
  knee.textContent = k.text;
  knee.classList.toggle('found', k.x !== null);
  const labels = points.map((p) => p.label);
  const lines = k.x !== null ? [{ x: points.findIndex((p) => p.pages >= Math.round(k.x)), color: COLORS.vermillion,
    label: `knee ≈ ${fmt.decimal(k.x, 1)} pages` }] : [];
  const note = answer.notice ? sentence(answer.notice + '; read these bars with care') : '';
  const extra = [];
  if (before) {
    const prev = new Map(before.points.map((p) => [p.pages, p.revenuePerSession]));
    extra.push({ type: 'line', label: 'Revenue per session, previous period', borderColor: COLORS.muted,
      borderDash: [6, 4], pointRadius: 2, data: points.map((p) => prev.get(p.pages) ?? null) });
  }
  curve.show(points, barsAndLine({
    labels, xTitle: 'Pages per session', extra, lines,
    bar: { label: 'Revenue per session', data: points.map((p) => p.revenuePerSession), color: alpha(COLORS.blue, 0.8),
      format: money },
    line: { label: 'Share of sessions', data: points.map((p) => p.share), color: COLORS.orange,
      format: (v) => fmt.percent(v, 0) },
  }), { note, label: `Revenue per session for ${points.length} session lengths` });
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
