// The application shell: site picker, screen navigation, segment bar, and rendering the screen of the URL.

import { h } from 'app/dom.js';
import { createApi } from 'app/api.js';
import { parseState, toSearch, withChanges } from 'app/state.js';
import { todayIn, presetRange } from 'app/range.js';
import { makeFormat } from 'app/format.js';
import { segmentBar } from 'app/segment-bar.js';
import { panel } from 'app/panel.js';
import * as sitesScreen from 'app/screens/sites.js';
import * as health from 'app/screens/health.js';
import * as density from 'app/screens/density.js';
import * as depth from 'app/screens/depth.js';
import * as engagement from 'app/screens/engagement.js';
import * as pages from 'app/screens/pages.js';
import * as geography from 'app/screens/geography.js';

const SCREENS = [sitesScreen, health, density, depth, engagement, pages, geography];
const locale = navigator.language || 'en';

// Records Content-Security-Policy violations so the browser test can assert there are none.
window.foldlineCspViolations = [];
document.addEventListener('securitypolicyviolation',
  (e) => window.foldlineCspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));

const bar = document.getElementById('progress');
let inFlight = 0;
const progress = {
  start() { inFlight++; bar.hidden = false; },
  done() { inFlight = Math.max(0, inFlight - 1); if (!inFlight) { bar.hidden = true; bar.removeAttribute('value'); } },
  steps(total) {
    let done = 0;
    bar.max = total;
    bar.value = 0;
    return () => { bar.value = ++done; };
  },
};
const api = createApi(progress);
const main = document.getElementById('main');
const nav = document.getElementById('nav');
const picker = document.getElementById('site-picker');
let sites = [];
let current = null;
let seq = 0;
let controller = null;

const siteOf = (state) => sites.find((s) => s.id === state.site) ?? null;
const today = () => todayIn(siteOf(current)?.timezone ?? Intl.DateTimeFormat().resolvedOptions().timeZone);
const segment = segmentBar((changes) => navigate(changes), today);
document.getElementById('segment').append(segment.el);

function navigate(changes, { render = true } = {}) {
  const next = withChanges(current, changes);
  const search = '?' + toSearch(next);
  if (search !== location.search) history.pushState(null, '', search);
  if (!render) { current = next; return; }
  performance.mark('foldline:change');
  route(next);
}

function link(state, text, attrs = {}) {
  return h('a', { href: '?' + toSearch(state), text, ...attrs, onclick: (e) => {
    if (e.button || e.metaKey || e.ctrlKey || e.shiftKey || e.altKey) return;
    e.preventDefault();
    navigate(state);
  } });
}

function drawNav(state) {
  nav.replaceChildren(h('ul', null, SCREENS.map((s) => {
    const target = withChanges(state, { screen: s.id });
    const disabled = s.id !== 'sites' && !state.site;
    return h('li', null, disabled ? h('span', { class: 'off', text: s.title, 'aria-disabled': 'true' })
      : link(target, s.title, { 'aria-current': s.id === state.screen ? 'page' : null, id: 'nav-' + s.id }));
  })));
  picker.replaceChildren(h('option', { value: '', text: sites.length ? 'Choose a site…' : 'No sites' }),
    ...sites.map((s) => h('option', { value: String(s.id), text: s.name })));
  picker.value = state.site ? String(state.site) : '';
}

async function route(state) {
  const mine = ++seq;
  controller?.abort();
  controller = new AbortController();
  const focusedId = main.contains(document.activeElement) ? document.activeElement.id : null;
  const screenChanged = current?.screen !== state.screen || current?.site !== state.site;
  const site = siteOf(state);
  if (site && state.screen !== 'sites' && (!state.from || !state.to)) {
    // pin the dates so that the address reproduces exactly this view later
    state = { ...state, ...presetRange('28d', todayIn(site.timezone)) };
    history.replaceState(null, '', '?' + toSearch(state));
  }
  current = state;
  const screen = SCREENS.find((s) => s.id === state.screen);
  drawNav(state);
  segment.sync(state);
  document.title = `${screen.title} · ${site ? site.name + ' · ' : ''}Foldline`;
  document.body.dataset.ready = 'false';
  for (const c of main.querySelectorAll('canvas')) window.Chart?.getChart(c)?.destroy();
  main.replaceChildren();
  main.dataset.screen = state.screen;
  const ctx = {
    state, site, sites, api, main, progress, signal: controller.signal, link,
    fmt: makeFormat(locale, site?.currency ?? 'EUR'), locale,
    navigate, setTable: (id, on) => navigate({ tables: on ? [...current.tables, id]
      : current.tables.filter((t) => t !== id) }, { render: false }),
    panel: (opts) => panel(ctx, opts),
    stale: () => mine !== seq,
  };
  try {
    if (state.screen !== 'sites' && !site) {
      main.append(h('h1', { id: 'screen-title', tabindex: '-1', text: 'Choose a site' }), h('p', { class: 'empty' },
        state.site ? `There is no site ${state.site} among the sites you can see. ` : 'This screen shows one site. ',
        link(withChanges(state, { screen: 'sites', site: null }), 'Go to the list of sites')));
    } else {
      await screen.render(ctx);
    }
  } catch (e) {
    if (e.name === 'AbortError' || mine !== seq) return;
    main.append(h('p', { class: 'error', role: 'alert', text: e.message || String(e) }));
  }
  if (mine !== seq) return;
  performance.mark('foldline:drawn');
  document.body.dataset.ready = 'true';
  document.body.dataset.renders = String(mine);
  const again = focusedId && document.getElementById(focusedId);
  if (again) again.focus();
  else if (screenChanged && mine > 1) document.getElementById('screen-title')?.focus();
}

async function start() {
  // after signing in, Spring Security returns to the saved address with a "continue" marker: drop it
  const params = new URLSearchParams(location.search);
  if (params.has('continue')) {
    params.delete('continue');
    history.replaceState(null, '', '?' + params.toString());
  }
  picker.addEventListener('change', () => {
    const id = Number(picker.value);
    if (id) navigate({ site: id, screen: current.screen === 'sites' ? 'health' : current.screen });
  });
  document.getElementById('sign-out').addEventListener('click', async () => {
    try { await api.post('/logout'); } catch { /* the answer is a redirect either way */ }
    location.assign('/login?logout');
  });
  window.addEventListener('popstate', () => route(parseState(location.search)));
  try {
    sites = await api.get('/api/v1/sites');
  } catch (e) {
    main.replaceChildren(h('h1', { text: 'Foldline' }), h('p', { class: 'error', role: 'alert', text: e.message }),
      e.login ? h('a', { href: '/login', text: 'Sign in' }) : null);
    document.body.dataset.ready = 'true';
    return;
  }
  route(parseState(location.search));
}

start();
