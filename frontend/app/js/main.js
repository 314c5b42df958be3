// The application shell: site picker, screen navigation, segment bar, and rendering the screen of the URL.

import { h } from './dom.js';
import { createApi } from './api.js';
import { parseState, toSearch, withChanges, resolveRange, ANALYSIS, SITE_SCREENS } from './state.js';
import { todayIn } from './range.js';
import { makeFormat } from './format.js';
import { segmentBar } from './segment-bar.js';
import { panel } from './panel.js';
import { viewTools } from './view-tools.js';
import { bell } from './bell.js';
import * as sitesScreen from './screens/sites.js';
import * as health from './screens/health.js';
import * as density from './screens/density.js';
import * as depth from './screens/depth.js';
import * as engagement from './screens/engagement.js';
import * as pages from './screens/pages.js';
import * as geography from './screens/geography.js';
import * as views from './screens/views.js';
import * as alerts from './screens/alerts.js';
import * as imports from './screens/imports.js';
import * as settings from './screens/settings.js';
import * as fit from './screens/fit.js';
import * as account from './screens/account.js';
import * as admin from './screens/admin.js';

const SCREENS = [sitesScreen, health, density, depth, engagement, pages, geography, views, alerts, imports, settings,
  fit, account, admin];
const ROLES = ['VIEWER', 'EDITOR', 'ADMIN'];
const locale = navigator.language || 'en';
const $ = (id) => document.getElementById(id);

// the browser test asserts that the Content-Security-Policy blocked nothing
window.foldlineCspViolations = [];
document.addEventListener('securitypolicyviolation',
  (e) => window.foldlineCspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));

const bar = $('progress');
let inFlight = 0;
const progress = {
  start() { inFlight++; bar.hidden = false; },
  done() { bar.hidden = !--inFlight; },
};
const api = createApi(progress);
const main = $('main');
const body = document.body.dataset;
let sites = [];
let me;
let current;
let seq = 0;
let controller;

const siteOf = (state) => sites.find((s) => s.id === state.site) ?? null;
const segment = segmentBar(navigate,
  () => todayIn(siteOf(current)?.timezone ?? Intl.DateTimeFormat().resolvedOptions().timeZone));
$('segment').append(segment.el);
const unread = bell(api, (site) => navigate({ screen: 'alerts', site: +site || current.site }));
$('user').before(unread.el);

function navigate(changes, { render = true } = {}) {
  const next = withChanges(current, changes);
  const search = '?' + toSearch(next);
  if (search !== location.search) history.pushState(null, '', search);
  if (!render) return (current = next);
  performance.mark('foldline:change');
  route(next);
}

function link(state, text, attrs) {
  return h('a', { href: '?' + toSearch(state), text, ...attrs, onclick: (e) => {
    if (e.button || e.metaKey || e.ctrlKey || e.shiftKey || e.altKey) return;
    e.preventDefault();
    navigate(state);
  } });
}

function drawNav(state, role) {
  const item = (s, text = s.title) => link(withChanges(state, { screen: s.id }), text,
    { 'aria-current': s.id === state.screen && 'page', id: 'nav-' + s.id });
  // screens of one site are greyed out until a site is chosen; its settings only for its admins
  $('nav').replaceChildren(h('ul', null, SCREENS.slice(0, 12).filter((s) => s !== settings || role === 'ADMIN')
    .map((s) => h('li', null, SITE_SCREENS.includes(s.id) && !state.site
      ? h('span.off', { text: s.title, 'aria-disabled': 'true' }) : item(s)))));
  $('user').replaceChildren(item(account, me.username), me.globalAdmin ? item(admin) : '');
  $('site-picker').replaceChildren(h('option', { value: '', text: sites.length ? 'Choose a site…' : 'No sites' }),
    ...sites.map((s) => h('option', { value: s.id, text: s.name, selected: s.id === state.site })));
}

async function route(state) {
  const mine = ++seq;
  controller?.abort();
  controller = new AbortController();
  const focusedId = main.contains(document.activeElement) && document.activeElement.id;
  const screenChanged = current?.screen !== state.screen || current?.site !== state.site;
  const site = siteOf(state);
  if (site && ANALYSIS.includes(state.screen)) {
    // without dates the last 28 days, relative in the address like a preset
    if (!state.range && (!state.from || !state.to)) state.range = '28d';
    state = resolveRange(state, todayIn(site.timezone));
  }
  history.replaceState(null, '', '?' + toSearch(state));
  current = state;
  const screen = SCREENS.find((s) => s.id === state.screen);
  const role = me.globalAdmin ? 'ADMIN' : me.sites?.[site?.id];
  drawNav(state, role);
  segment.sync(state);
  $('segment').hidden = !ANALYSIS.includes(state.screen) && state.screen !== 'sites';
  document.title = `${screen.title} · ${site ? site.name + ' · ' : ''}Foldline`;
  body.ready = 'false';
  for (const c of main.querySelectorAll('canvas')) window.Chart?.getChart(c)?.destroy();
  main.replaceChildren();
  main.dataset.screen = state.screen;
  const ctx = {
    state, site, sites, me, role, api, main, signal: controller.signal, link, locale, navigate, unread: unread.poll,
    can: (r) => ROLES.indexOf(role) >= ROLES.indexOf(r),
    fmt: makeFormat(locale, site?.currency ?? 'EUR'),
    setTable: (id, on) => navigate({ tables: on ? [...current.tables, id] : current.tables.filter((t) => t !== id) },
      { render: false }),
    panel: (opts) => panel(ctx, opts),
  };
  try {
    if (site) main.append(viewTools(ctx));
    if (SITE_SCREENS.includes(state.screen) && !site) {
      main.append(h('p.empty', null, state.site ? `There is no site ${state.site} among the sites you can see. ` : '',
        link(withChanges(state, { screen: 'sites', site: null }), 'Choose a site')));
    } else {
      await screen.render(ctx);
    }
  } catch (e) {
    if (e.name === 'AbortError' || mine !== seq) return;
    main.append(h('p.error', { text: e.message, role: 'alert' }));
  }
  if (mine !== seq) return;
  performance.mark('foldline:drawn');
  body.ready = 'true';
  body.renders = mine;
  const again = focusedId && $(focusedId);
  if (again) again.focus();
  else if (screenChanged && mine > 1) $('screen-title')?.focus();
}

$('site-picker').addEventListener('change', (e) => {
  const id = +e.target.value;
  if (id) navigate({ site: id, screen: current.screen === 'sites' ? 'health' : current.screen });
});
$('sign-out').addEventListener('click', async () => {
  try { await api.post('/logout'); } catch { /* the answer is a redirect either way */ }
  location.assign('/login.html?logout');
});
addEventListener('popstate', () => route(parseState(location.search)));
try {
  [sites, me] = await Promise.all([api.get('/api/v1/sites'), api.get('/api/v1/me')]);
  // after signing in, the address may carry Spring Security's "continue" marker: the canonical address drops it
  route(parseState(location.search));
} catch (e) {
  main.replaceChildren(h('h1', 'Foldline'), h('p.error', { text: e.message, role: 'alert' }),
    e.login ? h('a', { href: '/login.html', text: 'Sign in' }) : '');
  body.ready = 'true';
}
