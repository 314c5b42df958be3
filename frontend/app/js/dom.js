// Building DOM without HTML strings: every text, including labels from event data, goes in as a text node.

/** h('button', {class, text, onclick, 'aria-pressed': 'true'}, child…): `text` sets textContent, on… listens. */
export function h(tag, props, ...children) {
  const el = document.createElement(tag);
  for (const [k, v] of Object.entries(props ?? {})) {
    if (v === undefined || v === null || v === false) continue;
    if (k === 'text') el.textContent = v;
    else if (k === 'class') el.className = v;
    else if (k.startsWith('on')) el.addEventListener(k.slice(2), v);
    else if (k === 'value' || k === 'checked' || k === 'disabled' || k === 'hidden' || k === 'selected') el[k] = v;
    else el.setAttribute(k, v === true ? '' : String(v));
  }
  append(el, children);
  return el;
}

export function append(el, children) {
  for (const c of children.flat(Infinity)) {
    if (c === null || c === undefined || c === false) continue;
    el.append(c instanceof Node ? c : document.createTextNode(String(c)));
  }
  return el;
}

let ids = 0;
export const uid = (prefix) => `${prefix}-${++ids}`;

/** Saves a text or data URL as a file through a temporary link. */
export function download(name, content, type = 'text/csv;charset=utf-8') {
  const url = content.startsWith?.('data:') ? content : URL.createObjectURL(new Blob([content], { type }));
  const a = h('a', { href: url, download: name, hidden: true });
  document.body.append(a);
  a.click();
  a.remove();
  if (!url.startsWith('data:')) setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** A control with its visible label above it. */
export const field = (label, control, extra = '') => h('label', { class: 'field' + extra, for: control.id },
  h('span', { text: label }), control);

/** An <input> with an id, labelled by field(). */
export const input = (props) => h('input', { id: uid(props.name), autocomplete: 'off', ...props });

/** A labelled <select> with options [{value, label}] or strings. */
export function select(label, name, options, value, onchange, id = uid(name)) {
  return field(label, h('select', { id, name, onchange }, options.map((o) => (typeof o === 'string'
    ? { value: o, label: o } : o)).map((o) => h('option', { value: o.value, text: o.label, selected: o.value === value }))));
}
