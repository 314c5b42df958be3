// Reading depth: revenue per session by pages per session, what the n-th page adds, and the knee.

import { h } from '../dom.js';
import { heading, showScope, load, emptyMessage, withPrevious } from '../screen.js';
import { COLORS, barsAndLine } from '../charts.js';
import { kneeOf, sentence } from '../verdict.js';

export const id = 'depth';
export const title = 'Reading depth';

export async function render(ctx) {
  const { fmt } = ctx;
  const scope = heading(ctx, 'Reading depth', 'What a session earns by the pages it reads.');
  const knee = h('p.knee#depth-knee');
  const curve = ctx.panel({ id: 'revenue', title: 'Revenue per session by pages per session',
    columns: [['label', 'Pages per session'], ['sessions', 'Sessions', 'count'], ['share', 'Share of sessions', '%'],
      ['revenuePerSession', 'Revenue per session', 'money'], ['marginalRevenue', 'Value of the n-th page', 'money'],
      ...(ctx.state.compare ? [['previous', 'Previous period, revenue per session', 'money']] : [])],
    caption: 'Blue: mean revenue of sessions of that length (the last counts 11 pages or more). Green: what the n-th '
      + 'page adds, revenue per session of n pages minus that of n − 1. Line: the share of sessions.'
      + (ctx.state.compare ? ' Grey dashed: revenue per session in the previous period.' : '') });
  ctx.main.append(knee, curve.el);

  const [answer, prev] = await load(ctx, 'depth', {}, [curve]) ?? [];
  if (!answer) return;
  showScope(ctx, scope, answer.scope);
  const { points } = answer;
  if (!points.length) return curve.empty(emptyMessage('sessions', answer.notice));
  const k = kneeOf(answer.fit, answer.notice, (x) => `after about ${fmt.decimal(x, 1)} pages, a page adds less`);
  knee.textContent = k.text;
  knee.classList.toggle('found', k.x !== null);
  const lines = k.x !== null ? [{ x: points.findIndex((p) => p.pages >= Math.round(k.x)), color: COLORS.vermillion,
    label: `knee ≈ ${fmt.decimal(k.x, 1)} pages` }] : [];
  curve.show(points, barsAndLine({
    labels: points.map((p) => p.label), xTitle: 'Pages per session', lines,
    extra: [{ type: 'bar', label: 'Value of the n-th page', data: points.map((p) => p.marginalRevenue),
      backgroundColor: COLORS.green + 'cc' }, ...withPrevious(points, prev, 'revenuePerSession')],
    bar: { label: 'Revenue per session', data: points.map((p) => p.revenuePerSession), color: COLORS.blue + 'cc',
      format: fmt.money },
    line: { label: 'Share of sessions', data: points.map((p) => p.share), color: COLORS.orange,
      format: (v) => fmt.percent(v, 0) },
  }), { note: answer.notice && sentence(answer.notice + '; read these bars with care'),
    label: `Revenue per session for ${points.length} session lengths` });
}
