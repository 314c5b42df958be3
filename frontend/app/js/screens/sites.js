// Site list: every site the user can see, with its last 7 days (or the chosen dates).

import { h } from '../dom.js';
import { heading } from '../screen.js';
import { apiQuery, withChanges } from '../state.js';
import { todayIn, presetRange, PRESETS } from '../range.js';
import { makeFormat } from '../format.js';
import { sparkline } from '../charts.js';

export const id = 'sites';
export const title = 'Sites';

export async function render(ctx) {
  const { state } = ctx;
  const fixed = state.from && !state.range;
  heading(ctx, 'Sites', 'Each site you can see; choose one to open its health.').textContent = fixed
    ? ctx.fmt.range(state.from, state.to) + ', for every site'
    : PRESETS.find((p) => p.id === (state.range ?? '7d')).label + ', each site in its own time zone';
  if (!ctx.sites.length) {
    return ctx.main.append(h('p.empty', 'No sites yet: an administrator gives you a role on one.'));
  }
  const list = h('ul.site-list');
  ctx.main.append(list);
  await Promise.all(ctx.sites.map(async (site) => {
    const fmt = makeFormat(ctx.locale, site.currency);
    // a relative range counts in each site's own time zone
    const range = fixed ? state : presetRange(state.range ?? '7d', todayIn(site.timezone));
    const query = apiQuery({ ...state, ...range }, {}, { compare: false });
    const stats = h('dl.site-stats', { 'aria-busy': 'true' }, h('dt', 'Loading…'));
    const spark = h('canvas', { 'aria-hidden': 'true' });
    list.append(h('li.site-card', { 'data-site': site.id },
      h('h2', null, ctx.link(withChanges(state, { screen: 'health', site: site.id }), site.name)),
      h('p.quiet', `${site.domain} · ${site.timezone} · ${site.currency}`),
      stats, h('div.spark', null, spark)));
    try {
      const get = (name, q = '') => ctx.api.get(`/api/v1/sites/${site.id}/metrics/${name}`, query + q, ctx.signal);
      const [{ current: o }, series] = await Promise.all([get('overview'), get('timeseries', '&metric=sessions')]);
      stats.replaceChildren(...[['Sessions', fmt.count(o.sessions), 'sessions'],
        ['Bounce rate', fmt.percent(o.bounceRate), 'bounceRate'],
        ['Session RPM', fmt.money(o.sessionRpm), 'sessionRpm']]
        .flatMap(([label, value, key]) => [h('dt', label), h('dd', { text: value, 'data-key': key })]));
      sparkline(spark, series.points.map((p) => p.value));
    } catch (e) {
      if (e.name === 'AbortError') throw e;
      stats.replaceChildren(h('dt.error', e.message));
    } finally {
      stats.setAttribute('aria-busy', 'false');
    }
  }));
}
