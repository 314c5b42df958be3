// Building DOM without HTML strings: every text, including labels from event data, goes in as a text node.

// h('p.quiet#id', {text, onclick, 'aria-pressed': 'true'}, child…) or h('p.quiet', text); buttons are type=button
export function h(tag, props, ...children) {
  const [name, ...marks] = tag.split(/(?=[.#])/);
  const el = document.createElement(name);
  if (name === 'button') el.type = 'button';
  for (const m of marks) m[0] === '.' ? el.classList.add(m.slice(1)) : el.id = m.slice(1);
  for (const [k, v] of Object.entries(typeof props === 'string' ? { text: props } : props ?? {})) {
    if (v == null || v === false) continue;
    if (k === 'text') el.textContent = v;
    else if (k === 'class') el.className += ' ' + v;
    else if (k.startsWith('on')) el.addEventListener(k.slice(2), v);
    else if (['value', 'checked', 'disabled', 'hidden', 'selected'].includes(k)) el[k] = v;
    else el.setAttribute(k, v === true ? '' : v);
  }
  el.append(...children.flat(Infinity).filter((c) => c != null && c !== false));
  return el;
}

let ids = 0;
export const uid = (prefix) => `${prefix}-${++ids}`;

export function download(name, content, type = 'text/csv;charset=utf-8') {
  const url = content.startsWith('data:') ? content : URL.createObjectURL(new Blob([content], { type }));
  const a = h('a', { href: url, download: name, hidden: true });
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

export const field = (label, control, extra = '') => h('label', { class: 'field' + extra, for: control.id },
  h('span', label), control);

export const input = (props) => h('input', { id: uid(props.name), autocomplete: 'off', ...props });

export const select = (label, name, options, value, onchange, id = uid(name)) => field(label, h('select',
  { id, name, onchange }, options.map((o) => o.value ? o : { value: o, label: o })
    .map((o) => h('option', { value: o.value, text: o.label, selected: o.value === value }))));
