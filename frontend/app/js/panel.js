// A chart panel: title, caption, chart or data table, CSV and PNG export, loading, empty and error states.

import { h, uid, download } from './dom.js';
import { makeChart } from './charts.js';
import { toCsv, fileName } from './csv.js';

/** columns: [{key, label, format?(v, row), csv?(row), text?}]: the first heads the rows, others are numbers. */
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
    'aria-label': 'CSV of ' + title, onclick: () => download(name('csv'), toCsv(columns, rows)) });
  const png = h('button', { type: 'button', class: 'tool', id: 'png-' + id, text: 'PNG',
    'aria-label': 'PNG image of ' + title,
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
    png.disabled = on || el.dataset.state !== 'ready';
  }

  function setState(state, message = '', alert = false) {
    el.dataset.state = state;
    el.setAttribute('aria-busy', String(state === 'loading'));
    status.replaceChildren(...(Array.isArray(message) ? message : [message]));
    status.setAttribute('role', alert ? 'alert' : 'status');
    status.hidden = !message || (Array.isArray(message) && !message.length);
    for (const b of [csv, png, toggle]) b.disabled = state !== 'ready';
    png.disabled ||= tableShown;
  }

  const num = (c, i) => (i && !c.text ? 'num' : null);

  function fillTable() {
    table.replaceChildren(
      h('caption', { class: 'visually-hidden', text: title }),
      h('thead', null, h('tr', null, columns.map((c, i) => h('th', { scope: 'col', class: num(c, i), text: c.label })))),
      h('tbody', null, rows.map((r) => h('tr', null, columns.map((c, i) => {
        const v = c.format ? c.format(r[c.key], r) : r[c.key];
        return h(i ? 'td' : 'th', { scope: i ? null : 'row', class: num(c, i), text: v ?? '–' });
      })))));
  }

  showTable(tableShown);
  setState('loading', [h('span', { class: 'spinner', 'aria-hidden': 'true' }), 'Loading…']);

  return {
    el,
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
