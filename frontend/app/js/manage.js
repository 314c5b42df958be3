// Forms and lists of the screens that manage things (views, account, administration, site settings). A refused
// request shows each of the API's field errors under its field, the rest in the form's message.

import { h, field, input, uid } from './dom.js';
import { sentence } from './verdict.js';

// fields: [name (the API's), label, type or [options: value or [value, label]], value, attrs]; numbers go as numbers
// (empty: null), a file as its File; submit(values, the button pressed); `more`: further buttons
export function form(id, button, fields, submit, done, more) {
  const message = h('p.form-message', { role: 'alert' });
  const rows = fields.map(([name, label, type = 'text', value = '', attrs]) => {
    const error = h('span.field-error', { id: uid('error') });
    const a = { id: uid(name), name, value, 'aria-describedby': error.id, ...attrs };
    const c = type.map ? h('select', a, type.map((o) => [o].flat())
      .map(([v, text = v]) => h('option', { value: v, text, selected: v === value })))
      : type === 'textarea' ? h('textarea', a) : input({ type, checked: value === true, ...a });
    const row = type === 'checkbox' ? h('label.check', null, c, label) : field(label, c);
    row.append(error);
    return { name, type, c, error, row };
  });
  return h('form.inline-form', { id, novalidate: true, onsubmit: async (e) => {
    e.preventDefault();
    const values = {};
    for (const { name, type, c, error } of rows) {
      values[name] = type === 'checkbox' ? c.checked : type === 'number' ? (c.value ? +c.value : null)
        : c.files?.[0] ?? c.value;
      error.textContent = '';
      c.removeAttribute('aria-invalid');
    }
    message.textContent = '';
    try {
      done(await submit(values, e.submitter));
    } catch (err) {
      let left = err.message;
      for (const fe of err.errors ?? []) {
        // a nested field ("segment.device") goes to the field of its first part
        const r = rows.find((x) => (fe.field + '.').startsWith(x.name + '.'));
        if (!r) continue;
        r.c.setAttribute('aria-invalid', true);
        r.error.textContent = sentence(fe.message);
        left = 'Please correct the marked fields.';
      }
      message.textContent = left;
    }
  } }, rows.map((r) => r.row), h('button', { type: 'submit', text: button }), more, message);
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
