// Entry pages: the paths readers arrive on, with their bounce, value and ads, so editors see who loses readers.

import { h, field, input, select } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
import { COLORS } from '../charts.js';

export const id = 'pages';
export const title = 'Entry pages';

const VIEWS = [['Most sessions', 'sessions', 'desc'], ['Highest bounce', 'bounceRate', 'desc'],
  ['Highest session RPM', 'sessionRpm', 'desc'], ['Lowest session RPM', 'sessionRpm', 'asc']];
const short = (path) => (path.length > 42 ? path.slice(0, 41) + '…' : path);

export async function render(ctx) {
  const { fmt, state } = ctx;
  const { sort, order, q, minSessions, limit } = state.extras;
  const pct = (v) => fmt.percent(v);
  const go = (extras) => ctx.navigate({ extras });
  const scope = heading(ctx, 'Entry pages', 'The pages sessions start on: bounce, value and ads.');
  const view = VIEWS.find((v) => v[1] === sort && v[2] === order);
  const qInput = input({ type: 'search', name: 'q', value: q, maxlength: 200, placeholder: 'part of a path' });
  const minInput = input({ type: 'number', name: 'minSessions', min: 1, value: minSessions,
    placeholder: sort === 'sessions' ? '1' : '30' });
  const measure = { sessions: ['Sessions', fmt.count], bounceRate: ['Bounce rate', pct],
    sessionRpm: ['Session RPM', fmt.money] }[sort];
  const panel = ctx.panel({ id: 'pages',
    title: `${view?.[0] ?? 'Entry pages'}: ${measure[0].toLowerCase()} by entry path`,
    caption: 'One bar per path, labelled with its mean ads; bounce bars carry their 95% interval.'
      + (state.compare ? ' Grey: the same path in the previous period (none: fewer sessions than asked).' : ''),
    columns: [['path', 'Entry path'], ['sessions', 'Sessions', 'count'], ['bounceRate', 'Bounce rate', '%'],
      ['bounceLower', 'Bounce, 95% lower', '%'], ['bounceUpper', 'Bounce, 95% upper', '%'],
      ['pagesPerSession', 'Pages per session', '.2'], ['sessionRpm', 'Session RPM', 'money'],
      ['meanEntryAds', 'Ads on the page (mean)', '.1'],
      ...(state.compare ? [['previous', 'Previous period, ' + measure[0].toLowerCase(),
        { sessions: 'count', bounceRate: '%', sessionRpm: 'money' }[sort]]] : [])] });
  const count = h('p.quiet#pages-count');
  ctx.main.append(
    h('div.chips', { role: 'group', 'aria-label': 'Which pages' }, VIEWS.map(([text, s, o]) => h('button.chip',
      { text, 'aria-pressed': String(view?.[0] === text), onclick: () => go({ sort: s, order: o }) }))),
    h('form.inline-form', { role: 'search', onsubmit: (e) => {
      e.preventDefault();
      const min = minInput.value.trim();
      go({ q: qInput.value.trim(), minSessions: /^[1-9]\d{0,6}$/.test(min) ? min : '' });
    } }, field('Path contains', qInput), field('At least sessions', minInput),
    h('button', { type: 'submit', text: 'Search' }),
    select('Rows', 'limit', ['10', '20', '50', '100'], limit, (e) => go({ limit: e.target.value }))),
    count, panel.el);

  // the previous period: the same measure of the same paths, looked up among its 500 most visited
  const [answer, prev] = await load(ctx, 'pages', { sort, order, q, minSessions, limit }, [panel],
    { sort: 'sessions', q, minSessions: minSessions || (sort === 'sessions' ? '' : '30'), limit: 500 }) ?? [];
  if (!answer) return;
  showScope(ctx, scope, answer.scope, prev?.scope);
  const rows = answer.rows;
  if (prev) for (const r of rows) r.previous = prev.rows.find((p) => p.path === r.path)?.[sort] ?? null;
  count.textContent = `${fmt.count(answer.matchingPaths)} entry paths match; showing ${fmt.count(rows.length)}.`;
  if (!rows.length) {
    return panel.empty(q ? `No entry path with enough sessions contains “${q}”.`
      : emptyMessage('entry pages'));
  }
  // a bar per path, so the chart grows with the rows
  panel.el.querySelector('.chart-box').style.height = Math.max(340, 40 + 24 * rows.length) + 'px';
  const bounce = sort === 'bounceRate';
  panel.show(rows, {
    type: 'bar',
    data: {
      labels: rows.map((r) => `${short(r.path)} · ${fmt.decimal(r.meanEntryAds, 1)} ads`),
      datasets: [{ label: measure[0], data: rows.map((r) => r[sort]),
        backgroundColor: (bounce ? COLORS.vermillion : COLORS.blue) + 'bf',
        intervals: bounce && rows.map((r) => [r.bounceLower, r.bounceUpper]) },
      ...(prev ? [{ label: 'Previous period', data: rows.map((r) => r.previous), backgroundColor: COLORS.muted + '99' }]
        : [])],
    },
    options: {
      indexAxis: 'y',
      scales: { x: { beginAtZero: true, suggestedMax: bounce ? Math.min(1, Math.max(...rows.map((r) => r.bounceUpper)))
        : undefined, ticks: { callback: bounce ? (v) => fmt.percent(v, 0) : measure[1] } },
      y: { ticks: { autoSkip: false } } },
      plugins: { legend: { display: !!prev }, tooltip: { callbacks: {
        title: (items) => rows[items[0].dataIndex].path,
        label: ({ dataIndex: i, datasetIndex: d }) => d ? 'Previous period: '
          + (rows[i].previous === null ? 'too few sessions' : measure[1](rows[i].previous))
          : [`${fmt.count(rows[i].sessions)} sessions, bounce ${pct(rows[i].bounceRate)}`,
          `session RPM ${fmt.money(rows[i].sessionRpm)}, ${fmt.decimal(rows[i].meanEntryAds, 1)} ads on the page`],
      } } },
    },
  }, { label: `${measure[0]} of ${rows.length} entry paths` });
}
