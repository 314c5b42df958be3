// A chart panel: title, explanation, the chart, its data as a table (toggle), CSV and PNG export, and the
// loading, empty and error states.

import { h, uid, download } from './dom.js';
import { makeChart } from './charts.js';
import { toCsv, fileName } from './csv.js';

/**
 * @param ctx     the screen context (state, navigation)
 * @param opts    {id, title, caption, columns: [{key, label, format?(v, row), csv?(row), num?}], tools?: Node[]}
 */
export function panel(ctx, { id, title, caption, columns, tools = [] }) {
  const titleId = uid('title');
  const bodyId = uid('body');
  let rows = [];
  let chart = null;
  let tableShown = ctx.state.tables.includes(id);

  const status = h('div', { class: 'panel-status', role: 'status' });
  const canvas = h('canvas', { role: 'img', 'aria-label': title, id: 'chart-' + id });
  const chartBox = h('div', { class: 'chart-box' }, canvas);
  const table = h('table', { class: 'data' });
  const tableBox = h('div', { class: 'table-box', tabindex: '0', 'aria-label': title + ': data' }, table);
  const toggle = h('button', { type: 'button', class: 'tool', id: 'toggle-' + id, 'aria-controls': bodyId,
    onclick: () => { showTable(!tableShown); ctx.setTable(id, tableShown); } });
  const csv = h('button', { type: 'button', class: 'tool', id: 'csv-' + id, text: 'CSV',
    'aria-label': 'Download the data of "' + title + '" as CSV', onclick: () => download(name('csv'), toCsv(columns, rows)) });
  const png = h('button', { type: 'button', class: 'tool', id: 'png-' + id, text: 'PNG',
    'aria-label': 'Download the chart "' + title + '" as a PNG image',
    onclick: () => chart && download(name('png'), chart.toBase64Image('image/png', 1)) });
  const el = h('section', { class: 'panel', id: 'panel-' + id, 'aria-labelledby': titleId, 'data-state': 'loading' },
    h('header', { class: 'panel-head' },
      h('h2', { id: titleId, text: title }),
      h('div', { class: 'panel-tools' }, tools, toggle, csv, png)),
    caption ? h('p', { class: 'caption', text: caption }) : null,
    status,
    h('div', { id: bodyId, class: 'panel-body' }, chartBox, tableBox));

  function name(ext) {
    return fileName(['foldline', ctx.site?.domain, ctx.state.screen, id, ctx.state.from, ctx.state.to], ext);
  }

  function showTable(on) {
    tableShown = on;
    toggle.textContent = on ? 'Show chart' : 'Show table';
    toggle.setAttribute('aria-pressed', String(on));
    chartBox.hidden = on;
    tableBox.hidden = !on;
  }

  function setState(state, message = '', alert = false) {
    el.dataset.state = state;
    el.setAttribute('aria-busy', String(state === 'loading'));
    status.replaceChildren(...(Array.isArray(message) ? message : [message]));
    status.setAttribute('role', alert ? 'alert' : 'status');
    status.hidden = !message || (Array.isArray(message) && !message.length);
    for (const b of [csv, png, toggle]) b.disabled = state !== 'ready';
  }

  function fillTable() {
    table.replaceChildren(
      h('caption', { class: 'visually-hidden', text: title }),
      h('thead', null, h('tr', null, columns.map((c) => h('th', { scope: 'col', class: c.num ? 'num' : null, text: c.label })))),
      h('tbody', null, rows.map((r) => h('tr', null, columns.map((c, i) => {
        const v = c.format ? c.format(r[c.key], r) : r[c.key];
        return h(i === 0 ? 'th' : 'td', { scope: i === 0 ? 'row' : null, class: c.num ? 'num' : null, text: v ?? '–' });
      })))));
  }

  showTable(tableShown);
  setState('loading', h('span', { class: 'spinner', 'aria-hidden': 'true' }), false);
  status.append('Loading…');

  return {
    el,
    get chart() { return chart; },
    loading() {
      setState('loading', [h('span', { class: 'spinner', 'aria-hidden': 'true' }), 'Loading…']);
    },
    error(err) {
      chart?.destroy();
      chart = null;
      const parts = [err.message || String(err)];
      if (err.login) parts.push(' ', h('a', { href: '/login', text: 'Sign in' }));
      setState('error', parts, true);
      chartBox.hidden = true;
      tableBox.hidden = true;
    },
    empty(message) {
      chart?.destroy();
      chart = null;
      rows = [];
      setState('empty', message);
      chartBox.hidden = true;
      tableBox.hidden = true;
    },
    /** Shows rows in the table and the chart; `note` is an extra sentence above the chart (e.g. thin data). */
    show(newRows, config, { label, note } = {}) {
      rows = newRows;
      fillTable();
      showTable(tableShown);
      setState('ready', note ?? '');
      canvas.setAttribute('aria-label', label ?? title);
      chart = makeChart(canvas, config);
      return chart;
    },
  };
}
