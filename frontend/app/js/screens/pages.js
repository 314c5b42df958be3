// Entry pages: the paths readers arrive on, with their bounce, value and ads, so editors see who loses readers.

import { h, select, field, input } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
import { COLORS, alpha } from '../charts.js';

export const id = 'pages';
export const title = 'Entry pages';

const VIEWS = [
  { label: 'Most sessions', sort: 'sessions', order: 'desc' },
  { label: 'Highest bounce', sort: 'bounceRate', order: 'desc' },
  { label: 'Highest session RPM', sort: 'sessionRpm', order: 'desc' },
  { label: 'Lowest session RPM', sort: 'sessionRpm', order: 'asc' },
];
const MAX_LABEL = 42;
const short = (path) => (path.length > MAX_LABEL ? path.slice(0, MAX_LABEL - 1) + '…' : path);

export async function render(ctx) {
  const { fmt, state } = ctx;
  const { sort, order, q, minSessions, limit } = state.extras;
  const scope = heading(ctx, 'Entry pages', 'The pages sessions start on, with how many readers leave after them, '
    + 'what a visit earns, and how many ads they carry.');
  const views = h('div', { class: 'chips', role: 'group', 'aria-label': 'Which pages' }, VIEWS.map((v) => h('button', {
    type: 'button', class: 'chip', text: v.label, 'aria-pressed': String(v.sort === sort && v.order === order),
    onclick: () => ctx.navigate({ extras: { sort: v.sort, order: v.order } }) })));
  const qInput = input({ type: 'search', name: 'q', value: q, maxlength: '200', placeholder: 'part of a path' });
  const minInput = input({ type: 'number', name: 'minSessions', min: '1', value: minSessions,
    placeholder: sort === 'sessions' ? '1' : '30' });
  const search = h('form', { class: 'inline-form', role: 'search', onsubmit: (e) => {
    e.preventDefault();
    const min = minInput.value.trim();
    ctx.navigate({ extras: { q: qInput.value.trim(), minSessions: /^[1-9]\d{0,6}$/.test(min) ? min : '' } });
  } },
  field('Path contains', qInput), field('At least sessions', minInput),
  select('Rows', 'limit', ['10', '20', '50', '100'], limit,
    (e) => ctx.navigate({ extras: { limit: e.target.value } })),
  h('button', { type: 'submit', text: 'Search' }));
  const pct = (v) => fmt.percent(v);
  const columns = [
    { key: 'path', label: 'Entry path' },
    { key: 'sessions', label: 'Sessions', format: fmt.count },
    { key: 'bounceRate', label: 'Bounce rate', format: pct },
    { key: 'bounceLower', label: 'Bounce, 95% lower', format: pct },
    { key: 'bounceUpper', label: 'Bounce, 95% upper', format: pct },
    { key: 'pagesPerSession', label: 'Pages per session', format: (v) => fmt.decimal(v, 2) },
    { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, format: fmt.money },
    { key: 'meanEntryAds', label: 'Ads on the page (mean)', format: (v) => fmt.decimal(v, 1) },
  ];
  if (state.compare) columns.push({ key: 'previous', label: 'Bounce rate, previous period', format: pct });
  const measure = sort === 'sessions' ? { key: 'sessions', label: 'Sessions', format: fmt.count }
    : sort === 'bounceRate' ? { key: 'bounceRate', label: 'Bounce rate', format: pct }
      : { key: 'sessionRpm', label: 'Session RPM', format: fmt.money };
  const panel = ctx.panel({ id: 'pages', title: `${VIEWS.find((v) => v.sort === sort && v.order === order)?.label
    ?? 'Entry pages'}: ${measure.label.toLowerCase()} by entry path`, columns,
  caption: 'Each bar is one entry path; its label ends with the mean number of ads on that page. Bounce bars carry '
    + 'their 95% interval. The table has every column.' });
  const count = h('p', { class: 'quiet', id: 'pages-count' });
  ctx.main.append(views, search, count, panel.el);

  const loaded = await load(ctx, 'pages', { sort, order, q, minSessions, limit }, [panel], { sort: 'sessions', limit: 500, q });
  if (!loaded) return;
  const [answer, before] = loaded;
  showScope(ctx, scope, answer.scope, before?.scope);
  const rows = answer.rows;
  count.textContent = `${fmt.count(answer.matchingPaths)} entry paths match; showing ${fmt.count(rows.length)}.`;
  if (!rows.length) {
    panel.empty(q ? `No entry path contains “${q}” with enough sessions. Try a shorter text or a lower minimum.`
      : emptyMessage('entry pages with enough sessions', null));
    return;
  }
  const prev = new Map(before?.rows.map((r) => [r.path, r.bounceRate]));
  for (const r of rows) r.previous = prev.get(r.path) ?? null;
  panel.el.querySelector('.chart-box').classList.add(rows.length <= 10 ? 'chart-box' : rows.length <= 20 ? 'size-l'
    : rows.length <= 50 ? 'size-xl' : 'size-xxl');
  panel.show(rows, {
    type: 'bar',
    data: {
      labels: rows.map((r) => `${short(r.path)} · ${fmt.decimal(r.meanEntryAds, 1)} ads`),
      datasets: [{ label: measure.label, data: rows.map((r) => r[measure.key]),
        backgroundColor: alpha(sort === 'bounceRate' ? COLORS.vermillion : COLORS.blue, 0.75),
        intervals: sort === 'bounceRate' ? rows.map((r) => ({ lower: r.bounceLower, upper: r.bounceUpper })) : null }],
    },
    options: {
      indexAxis: 'y',
      scales: { x: { beginAtZero: true, suggestedMax: sort === 'bounceRate' ? Math.min(1, Math.max(...rows.map((r) => r.bounceUpper))) : undefined, ticks: { callback: (v) => (sort === 'bounceRate' ? fmt.percent(v, 0)
        : measure.format(v)) } }, y: { ticks: { autoSkip: false } } },
      plugins: { legend: { display: false }, tooltip: { callbacks: {
        title: (items) => rows[items[0].dataIndex].path,
        label: (c) => {
          const r = rows[c.dataIndex];
          return [`${fmt.count(r.sessions)} sessions, bounce ${pct(r.bounceRate)}`,
            `session RPM ${fmt.money(r.sessionRpm)}, ${fmt.decimal(r.meanEntryAds, 1)} ads on the page`];
        } } } },
    },
  }, { label: `${measure.label} of ${rows.length} entry paths` });
}
