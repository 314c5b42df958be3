// Geography: countries or regions with their share of traffic and what a page and a visit earn against the site.

import { h, select } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
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
      (e) => ctx.navigate({ extras: { by: e.target.value } }), 'geo-by'),
    select('Sort by', 'sort', [{ value: 'sessions', label: 'Sessions' }, { value: 'pageRpm', label: 'Page RPM' },
      { value: 'sessionRpm', label: 'Session RPM' }], sort, (e) => ctx.navigate({ extras: { sort: e.target.value } }),
    'geo-sort'),
    h('button', { type: 'button', class: 'tool', id: 'geo-order', text: order === 'desc' ? 'Highest first' : 'Lowest first',
    onclick: () => ctx.navigate({ extras: { order: order === 'desc' ? 'asc' : 'desc' } }) }),
  ];
  const place = (r) => (by !== 'region' ? countryName(locale, r.country)
    : r.region ? `${r.region}, ${countryName(locale, r.country)}` : `${countryName(locale, r.country)}, no region`);
  const columns = [
    { key: 'country', label: by === 'region' ? 'Region' : 'Country', format: (_v, r) => place(r),
      csv: (r) => (by === 'region' ? r.region : r.country) },
    ...(by === 'region' ? [{ key: 'countryCode', label: 'Country', text: true, csv: (r) => r.country, format: (_v, r) => r.country }] : []),
    { key: 'sessions', label: 'Sessions', format: fmt.count },
    { key: 'share', label: 'Share of sessions', format: (v) => fmt.percent(v) },
    { key: 'pageviews', label: 'Pageviews', format: fmt.count },
    { key: 'pageRpm', label: `Page RPM (${fmt.currency})`, format: fmt.money },
    { key: 'pageRpmVsSite', label: 'Page RPM vs site', format: fmt.times },
    { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, format: fmt.money },
    { key: 'sessionRpmVsSite', label: 'Session RPM vs site', format: fmt.times },
  ];
  if (state.compare) columns.push({ key: 'previous', label: `Session RPM, previous period (${fmt.currency})`, format: fmt.money });
  const panel = ctx.panel({ id: 'geo', title: `Page and session RPM by ${by}`, tools, columns,
    caption: `The ${CHART_ROWS} first ${by === 'region' ? 'regions' : 'countries'} in the chosen order; the table `
      + 'lists all. Dashed lines are the site averages.' });
  ctx.main.append(panel.el);
  const loaded = await load(ctx, 'geography', { by, sort, order }, [panel], { by });
  if (!loaded) return;
  const [answer, before] = loaded;
  showScope(ctx, scope, answer.scope, before?.scope);
  const rows = answer.rows;
  if (!rows.length) {
    panel.empty(emptyMessage('sessions with a known country', null));
    return;
  }
  const key = (r) => `${r.country}|${r.region}`;
  const prev = new Map(before?.rows.map((r) => [key(r), r.sessionRpm]));
  for (const r of rows) r.previous = prev.get(key(r)) ?? null;
  const shown = rows.slice(0, CHART_ROWS);
  panel.el.querySelector('.chart-box').classList.add(shown.length <= 6 ? 'chart-box' : 'size-l');
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
