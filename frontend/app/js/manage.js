// Forms and lists of the screens that manage things (views, account, administration, site settings). A refused
// request shows each of the API's field errors under its field, the rest in the form's message.

import { h, field, input, uid } from './dom.js';
import { sentence } from './verdict.js';

// fields: [name (the API's), label, type or [options], value, attrs]; numbers go as numbers (empty: null)
export function form(id, button, fields, submit, done) {
  const message = h('p.form-message', { role: 'alert' });
  const rows = fields.map(([name, label, type = 'text', value = '', attrs]) => {
    const error = h('span.field-error', { id: uid('error') });
    const c = type.map ? h('select', { id: uid(name), name }, type.map((o) => h('option', { value: o, text: o })))
      : input({ name, type, value, checked: value === true, 'aria-describedby': error.id, ...attrs });
    const row = type === 'checkbox' ? h('label.check', null, c, label) : field(label, c);
    row.append(error);
    return { name, type, c, error, row };
  });
  return h('form.inline-form', { id, novalidate: true, onsubmit: async (e) => {
    e.preventDefault();
    const values = {};
    for (const { name, type, c, error } of rows) {
      values[name] = type === 'checkbox' ? c.checked : type === 'number' ? (c.value ? +c.value : null) : c.value;
      error.textContent = '';
      c.removeAttribute('aria-invalid');
    }
    message.textContent = '';
    try {
      done(await submit(values));
    } catch (err) {
      let left = err.message;
      for (const fe of err.errors ?? []) {
        const r = rows.find((x) => x.name === fe.field);
        if (!r) continue;
        r.c.setAttribute('aria-invalid', true);
        r.error.textContent = sentence(fe.message);
        left = 'Please correct the marked fields.';
      }
      message.textContent = left;
    }
  } }, rows.map((r) => r.row), h('button', { type: 'submit', text: button }), message);
}

// columns: [[heading, (row, index) → text or nodes]]; `none` says that there are no rows
export const table = (id, columns, rows, none) => (rows.length ? h('table.data', { id },
  h('thead', null, h('tr', null, columns.map(([c]) => h('th', { scope: 'col', text: c })))),
  h('tbody', null, rows.map((r, i) => h('tr', null, columns.map(([, f]) => h('td', null, f(r, i)))))))
  : h('p.quiet', none));

// a panel drawn by draw(reload); reload(note) draws it again after a change, with a note shown once
export async function section(ctx, title, draw) {
  const el = ctx.main.appendChild(h('section.panel'));
  const reload = async (note) => el.replaceChildren(h('h2', title), note ?? '', ...[await draw(reload).catch((e) => {
    if (e.name === 'AbortError') throw e;
    return h('p.error', { text: e.message, role: 'alert' });
  })].flat());
  return reload();
}

// calls the API unless call() gives no promise, then reload(); a failure shows in the button's place
export const action = (text, label, call, reload) => h('button.link', { text, 'aria-label': label,
  onclick: (e) => call()?.then(() => reload(), (err) => e.target.replaceWith(h('span.error', err.message))) });

// a read-only text to copy: a link, a new key
export const copyable = (value, label, id) => h('input', { id, readonly: true, value, 'aria-label': label,
  onfocus: (e) => e.target.select() });

export const secret = (what, value) => h('div.secret', { role: 'status' },
  h('p', `Your new ${what}. Copy it now: it is shown only once.`), copyable(value, what));

export const ok = (text) => h('p.ok', { role: 'status', text });
