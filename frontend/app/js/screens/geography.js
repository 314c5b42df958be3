// Geography: countries or regions with their share of traffic and what a page and a visit earn against the site.

import { h, select } from '../dom.js';
import { heading, showScope, metrics, previous, emptyMessage } from '../screen.js';
import { COLORS, alpha } from '../charts.js';
import { countryName } from '../format.js';

export const id = 'geography';
export const title = 'Geography';

const CHART_ROWS = 15;

export async function render(ctx) {
  const { fmt, state, locale } = ctx;
  const { by, sort, order } = state.extras;
  const scope = heading(ctx, 'Geography', 'Where readers come from and what their visits earn compared with the '
    + 'site as a whole (1.00× = site average).');
  const tools = [
    select('Group by', 'by', [{ value: 'country', label: 'Country' }, { value: 'region', label: 'Region' }], by,
      (e) => ctx.navigate({ extras: { by: e.target.value } })),
    select('Sort by', 'sort', [{ value: 'sessions', label: 'Sessions' }, { value: 'pageRpm', label: 'Page RPM' },
      { value: 'sessionRpm', label: 'Session RPM' }], sort, (e) => ctx.navigate({ extras: { sort: e.target.value } })),
    h('button', { type: 'button', class: 'tool', id: 'geo-order', 'aria-label': `Order: ${order === 'desc'
      ? 'highest first' : 'lowest first'}; change`, text: order === 'desc' ? 'Highest first' : 'Lowest first',
    onclick: () => ctx.navigate({ extras: { order: order === 'desc' ? 'asc' : 'desc' } }) }),
  ];
  tools.forEach((t, i) => { const s = t.querySelector?.('select'); if (s) s.id = ['geo-by', 'geo-sort'][i]; });
  const place = (r) => (by === 'region' ? `${r.region ?? '(no region)'} · ${r.country ?? '?'}` : countryName(locale, r.country));
  const columns = [
    { key: 'country', label: by === 'region' ? 'Region' : 'Country', format: (_v, r) => place(r),
      csv: (r) => (by === 'region' ? r.region : r.country) },
    ...(by === 'region' ? [{ key: 'countryCode', label: 'Country', csv: (r) => r.country, format: (_v, r) => r.country }] : []),
    { key: 'sessions', label: 'Sessions', num: true, format: fmt.count },
    { key: 'share', label: 'Share of sessions', num: true, format: (v) => fmt.percent(v) },
    { key: 'pageviews', label: 'Pageviews', num: true, format: fmt.count },
    { key: 'pageRpm', label: `Page RPM (${fmt.currency})`, num: true, format: fmt.money },
    { key: 'pageRpmVsSite', label: 'Page RPM vs site', num: true, format: fmt.times },
    { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, num: true, format: fmt.money },
    { key: 'sessionRpmVsSite', label: 'Session RPM vs site', num: true, format: fmt.times },
  ];
  if (state.compare) {
    columns.push({ key: 'previousSessionRpm', label: `Session RPM, previous period (${fmt.currency})`, num: true,
      format: fmt.money });
  }
  const panel = ctx.panel({ id: 'geo', title: `Page and session RPM by ${by}`, tools, columns,
    caption: `The ${CHART_ROWS} first ${by === 'region' ? 'regions' : 'countries'} in the chosen order; the table `
      + 'lists all. Dashed lines are the site averages.' });
  ctx.main.append(panel.el);
  let answer;
  let before;
  try {
    [answer, before] = await Promise.all([metrics(ctx, 'geography', { by, sort, order }), previous(ctx, 'geography', { by })]);
  } catch (e) {
    if (e.name === 'AbortError') throw e;
    panel.error(e);
    return;
  }
  showScope(ctx, scope, answer.scope, before?.scope);
  const rows = answer.rows;
  if (!rows.length) {
    panel.empty(emptyMessage('sessions with a known country', null));
    return;
  }
  if (before) {
    const key = (r) => `${r.country}|${r.region}`;
    const prev = new Map(before.rows.map((r) => [key(r), r.sessionRpm]));
    for (const r of rows) r.previousSessionRpm = prev.get(key(r)) ?? null;
  }
  const shown = rows.slice(0, CHART_ROWS);
  panel.el.querySelector('.chart-box').classList.add(shown.length <= 6 ? 'size-m' : 'size-l');
  const site = answer.site;
  panel.show(rows, {
    type: 'bar',
    data: {
      labels: shown.map((r) => `${place(r)} · ${fmt.percent(r.share, 0)}`),
      datasets: [
        { label: 'Page RPM', data: shown.map((r) => r.pageRpm), backgroundColor: alpha(COLORS.sky, 0.85) },
        { label: 'Session RPM', data: shown.map((r) => r.sessionRpm), backgroundColor: alpha(COLORS.blue, 0.85) },
      ],
    },
    options: {
      indexAxis: 'y',
      scales: { x: { beginAtZero: true, ticks: { callback: (v) => fmt.money(v) } }, y: { ticks: { autoSkip: false } } },
      plugins: {
        flGuides: { lines: [
          { y: site.pageRpm, color: COLORS.sky, label: `site page RPM ${fmt.money(site.pageRpm)}` },
          { y: site.sessionRpm, color: COLORS.blue, label: `site session RPM ${fmt.money(site.sessionRpm)}` },
        ] },
        tooltip: { callbacks: { label: (c) => {
          const r = shown[c.dataIndex];
          return c.datasetIndex === 0 ? `Page RPM ${fmt.money(r.pageRpm)} (${fmt.times(r.pageRpmVsSite)} the site)`
            : `Session RPM ${fmt.money(r.sessionRpm)} (${fmt.times(r.sessionRpmVsSite)} the site)`;
        } } },
      },
    },
  }, { label: `Page and session RPM of ${shown.length} ${by === 'region' ? 'regions' : 'countries'}` });
}
