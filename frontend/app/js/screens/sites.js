// Site list and picker: every site the user can see, with its last 7 days (or the chosen dates).

import { h } from '../dom.js';
import { heading } from '../screen.js';
import { apiQuery, withChanges } from '../state.js';
import { todayIn, presetRange } from '../range.js';
import { makeFormat } from '../format.js';
import { sparkline } from '../charts.js';

export const id = 'sites';
export const title = 'Sites';

export async function render(ctx) {
  const scope = heading(ctx, 'Sites', 'Sessions, bounce rate and revenue per 1,000 sessions of each site you can see. '
    + 'Choose a site to open its health screen.');
  const { state } = ctx;
  scope.textContent = state.from && state.to ? ctx.fmt.range(state.from, state.to) + ', for every site'
    : 'Last 7 days, each site in its own time zone';
  if (!ctx.sites.length) {
    ctx.main.append(h('p', { class: 'empty', text: 'There are no sites you can see yet. An administrator creates '
      + 'sites and gives you a role on them.' }));
    return;
  }
  const list = h('ul', { class: 'site-list' });
  ctx.main.append(list);
  const tick = ctx.progress.steps(ctx.sites.length);
  await Promise.all(ctx.sites.map(async (site) => {
    const fmt = makeFormat(ctx.locale, site.currency);
    const range = state.from && state.to ? { from: state.from, to: state.to } : presetRange('7d', todayIn(site.timezone));
    const query = apiQuery({ ...state, ...range }, {}, { compare: false });
    const stats = h('dl', { class: 'site-stats', 'aria-busy': 'true' }, h('dt', { text: 'Loading…' }));
    const spark = h('canvas', { 'aria-hidden': 'true' });
    list.append(h('li', { class: 'site-card', 'data-site': String(site.id) },
      h('h2', null, ctx.link(withChanges(state, { screen: 'health', site: site.id }), site.name)),
      h('p', { class: 'muted', text: `${site.domain} · ${site.timezone} · ${site.currency}` }),
      stats, h('div', { class: 'spark' }, spark)));
    try {
      const base = `/api/v1/sites/${site.id}/metrics/`;
      const [overview, series] = await Promise.all([ctx.api.get(base + 'overview', query, ctx.signal),
        ctx.api.get(base + 'timeseries', query + '&metric=sessions', ctx.signal)]);
      const o = overview.current;
      const item = (label, value, key) => [h('dt', { text: label }), h('dd', { text: value, 'data-key': key })];
      stats.replaceChildren(...item('Sessions', fmt.count(o.sessions), 'sessions'),
        ...item('Bounce rate', fmt.percent(o.bounceRate), 'bounceRate'),
        ...item('Session RPM', fmt.money(o.sessionRpm), 'sessionRpm'));
      sparkline(spark, series.points.map((p) => p.value));
    } catch (e) {
      if (e.name === 'AbortError') throw e;
      stats.replaceChildren(h('dt', { class: 'error', text: e.message }));
    } finally {
      stats.setAttribute('aria-busy', 'false');
      tick();
    }
  }));
}
