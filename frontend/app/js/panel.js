// A chart panel: title, caption, chart or data table, CSV and PNG export, loading, empty and error states.

import { h, uid, download } from './dom.js';
import { makeChart } from './charts.js';
import { toCsv, fileName } from './csv.js';

// columns: [key, label, format (a function or a name below), {csv(row), text}]; the first column heads the rows
export function panel(ctx, { id, title, caption, columns, tools = [] }) {
  const { fmt } = ctx;
  const named = { count: fmt.count, money: fmt.money, x: fmt.times, '%': (v) => fmt.percent(v),
    '%0': (v) => fmt.percent(v, 0), '.1': (v) => fmt.decimal(v, 1), '.2': (v) => fmt.decimal(v, 2) };
  columns = columns.map(([key, label, format, more]) => ({ key, format: named[format] ?? format, ...more,
    label: format === 'money' ? `${label} (${fmt.currency})` : label }));
  const bodyId = uid('body');
  let rows = [];
  let chart;
  let tableShown = ctx.state.tables.includes(id);
  const status = h('div.panel-status', { role: 'status' });
  const canvas = h('canvas', { role: 'img', id: 'chart-' + id });
  const chartBox = h('div.chart-box', null, canvas);
  const table = h('table.data');
  const tableBox = h('div.table-box', { tabindex: '0', 'aria-label': title + ': data' }, table);
  const tool = (name, text, label, onclick) => h('button.tool', { id: `${name}-${id}`, text, onclick,
    'aria-label': label && `${label} of ${title}`, 'aria-controls': !label && bodyId });
  const { screen, from, to } = ctx.state;
  const name = (ext) => fileName(['foldline', ctx.site?.domain, screen, id, from, to], ext);
  const toggle = tool('toggle', '', null, () => { showTable(!tableShown); ctx.setTable(id, tableShown); });
  const csv = tool('csv', 'CSV', 'CSV', () => download(name('csv'), toCsv(columns, rows)));
  const png = tool('png', 'PNG', 'PNG image', () => download(name('png'), chart.toBase64Image('image/png', 1)));
  const titleId = uid('title');
  const el = h('section.panel', { id: 'panel-' + id, 'aria-labelledby': titleId },
    h('header.panel-head', null, h('h2', { id: titleId, text: title }),
      h('div.panel-tools', null, tools, toggle, csv, png)),
    caption && h('p.caption', caption), status, h('div', { id: bodyId }, chartBox, tableBox));

  function showTable(on) {
    tableShown = on;
    toggle.textContent = on ? 'Show chart' : 'Show table';
    toggle.setAttribute('aria-pressed', on);
    chartBox.hidden = on;
    tableBox.hidden = !on;
    png.disabled = on || el.dataset.state !== 'ready';
  }

  function setState(state, message = '', alert = false) {
    el.dataset.state = state;
    el.setAttribute('aria-busy', state === 'loading');
    status.replaceChildren(...[message].flat());
    status.setAttribute('role', alert ? 'alert' : 'status');
    status.hidden = !status.textContent;
    for (const b of [csv, png, toggle]) b.disabled = state !== 'ready';
    png.disabled ||= tableShown;
    if (state !== 'ready') {
      chart?.destroy();
      chart = null;
      chartBox.hidden = tableBox.hidden = true;
    }
  }

  const num = (c, i) => (i && !c.text ? 'num' : null);
  showTable(tableShown);
  setState('loading', 'Loading…');
  return {
    el,
    error(err) {
      setState('error', [err.message, err.login ? [' ', h('a', { href: '/login.html', text: 'Sign in' })] : []], true);
    },
    empty(message) {
      rows = [];
      setState('empty', message);
    },
    show(newRows, config, { label = title, note } = {}) {
      rows = newRows;
      table.replaceChildren(h('caption.visually-hidden', title),
        h('thead', null, h('tr', null, columns.map((c, i) => h('th', { scope: 'col', class: num(c, i),
          text: c.label })))),
        h('tbody', null, rows.map((r) => h('tr', null, columns.map((c, i) => h(i ? 'td' : 'th', { scope: !i && 'row',
          class: num(c, i), text: (c.format ? c.format(r[c.key], r) : r[c.key]) ?? '–' }))))));
      setState('ready', note || '');
      showTable(tableShown);
      canvas.setAttribute('aria-label', label);
      return (chart = makeChart(canvas, config));
    },
  };
}
