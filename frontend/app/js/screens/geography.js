// Geography: countries or regions with their share of traffic and what a page and a visit earn against the site.

import { h, select } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
import { COLORS } from '../charts.js';
import { countryName } from '../format.js';

export const id = 'geography';
export const title = 'Geography';

export async function render(ctx) {
  const { fmt, state, locale } = ctx;
  const { by, sort, order } = state.extras;
  const regions = by === 'region';
  const go = (name) => (e) => ctx.navigate({ extras: { [name]: e.target.value } });
  const scope = heading(ctx, 'Geography', 'Where readers come from and what their visits earn against the site '
    + 'average (1.00×).');
  const country = (r) => countryName(locale, r.country);
  const place = (r) => (!regions ? country(r) : r.region ? `${r.region}, ${country(r)}` : `${country(r)}, no region`);
  const panel = ctx.panel({ id: 'geo', title: `Page and session RPM by ${by}`,
    caption: 'The first 15 in this order (the table lists all); dashed lines: the site averages.',
    tools: [
      select('Group by', 'by', [{ value: 'country', label: 'Country' }, { value: 'region', label: 'Region' }], by,
        go('by'), 'geo-by'),
      select('Sort by', 'sort', [{ value: 'sessions', label: 'Sessions' }, { value: 'pageRpm', label: 'Page RPM' },
        { value: 'sessionRpm', label: 'Session RPM' }], sort, go('sort'), 'geo-sort'),
      h('button.tool#geo-order', { text: order === 'desc' ? 'Highest first' : 'Lowest first',
        onclick: () => ctx.navigate({ extras: { order: order === 'desc' ? 'asc' : 'desc' } }) }),
    ],
    columns: [['country', regions ? 'Region' : 'Country', (_v, r) => place(r), { csv: (r) => r[by] }],
      ...(regions ? [['country', 'Country', null, { text: true }]] : []),
      ['sessions', 'Sessions', 'count'], ['share', 'Share of sessions', '%'], ['pageviews', 'Pageviews', 'count'],
      ['pageRpm', 'Page RPM', 'money'], ['pageRpmVsSite', 'Page RPM vs site', 'x'],
      ['sessionRpm', 'Session RPM', 'money'], ['sessionRpmVsSite', 'Session RPM vs site', 'x'],
      ...(state.compare ? [['previous', 'Session RPM, previous period', 'money']] : [])] });
  ctx.main.append(panel.el);
  const loaded = await load(ctx, 'geography', { by, sort, order }, [panel], { by });
  if (!loaded) return;
  const [answer, before] = loaded;
  showScope(ctx, scope, answer.scope, before?.scope);
  const rows = answer.rows;
  if (!rows.length) return panel.empty(emptyMessage('sessions with a known country'));
  const key = (r) => r.country + r.region;
  const prev = new Map(before?.rows.map((r) => [key(r), r.sessionRpm]));
  for (const r of rows) r.previous = prev.get(key(r)) ?? null;
  const shown = rows.slice(0, 15);
  panel.el.querySelector('.chart-box').style.height = Math.max(340, 60 + 30 * shown.length) + 'px';
  const { site } = answer;
  const bars = (label, k, color) => ({ label, data: shown.map((r) => r[k]), backgroundColor: color + 'd9' });
  panel.show(rows, {
    type: 'bar',
    data: { labels: shown.map((r) => `${place(r)} · ${fmt.percent(r.share, 0)}`),
      datasets: [bars('Page RPM', 'pageRpm', COLORS.sky), bars('Session RPM', 'sessionRpm', COLORS.blue)] },
    options: {
      indexAxis: 'y',
      scales: { x: { beginAtZero: true, ticks: { callback: fmt.money } }, y: { ticks: { autoSkip: false } } },
      plugins: {
        flGuides: { lines: [
          { y: site.pageRpm, color: COLORS.sky, label: `site page RPM ${fmt.money(site.pageRpm)}` },
          { y: site.sessionRpm, color: COLORS.blue, label: `site session RPM ${fmt.money(site.sessionRpm)}` },
        ] },
        tooltip: { callbacks: { label: (c) => {
          const [r, k] = [shown[c.dataIndex], c.datasetIndex ? 'sessionRpm' : 'pageRpm'];
          return `${c.dataset.label} ${fmt.money(r[k])} (${fmt.times(r[k + 'VsSite'])} the site)`;
        } } },
      },
    },
  }, { label: `Page and session RPM of ${shown.length} ${regions ? 'regions' : 'countries'}` });
}
