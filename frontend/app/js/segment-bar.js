// The segment bar on every screen: dates, reader filters, comparison. It only proposes changes of the URL state.

import { h, field, input } from './dom.js';
import { DEVICES, SOURCES, FILTERS } from './state.js';
import { PRESETS, presetRange, matchPreset, isIsoDate, daysIn } from './range.js';

const HINTS = { country: 'PT, ES', region: 'PT-11', browser: 'any', variant: 'any' };

/** onChange(changes of the state); today() the site's date. */
export function segmentBar(onChange, today) {
  const presets = PRESETS.map((p) => h('button', { type: 'button', class: 'chip', 'data-preset': p.id, text: p.label,
    onclick: () => onChange(presetRange(p.id, today())) }));
  const from = input({ type: 'date', name: 'from' });
  const to = input({ type: 'date', name: 'to' });
  const changed = () => onChange({ filters: readFilters() });
  // device and source from fixed lists; the others are labels from event data, comma-separated
  const controls = FILTERS.map((name) => {
    const values = { device: DEVICES, source: SOURCES }[name];
    const el = values ? h('select', { id: 'segment-' + name, name, onchange: changed },
      h('option', { value: '', text: 'Any' }), values.map((v) => h('option', { value: v, text: v })))
      : input({ type: 'text', name, placeholder: HINTS[name], spellcheck: 'false', maxlength: '200', onchange: changed });
    return { name, el, field: field(name[0].toUpperCase() + name.slice(1), el) };
  });
  const compare = input({ type: 'checkbox', name: 'compare', onchange: () => onChange({ compare: compare.checked }) });
  const message = h('p', { class: 'segment-message', role: 'alert' });

  function readFilters() {
    const filters = {};
    for (const c of controls) {
      const v = c.el.value.split(',').map((s) => s.trim()).filter(Boolean);
      if (v.length) filters[c.name] = v;
    }
    return filters;
  }

  const el = h('form', { class: 'segment', 'aria-label': 'Segment', novalidate: true, onsubmit: (e) => {
    e.preventDefault();
    message.textContent = !isIsoDate(from.value) || !isIsoDate(to.value) ? 'Enter both dates in full.'
      : from.value > to.value ? 'The start date must not be after the end date.'
        : daysIn(from.value, to.value) > 400 ? 'A range can cover at most 400 days.' : '';
    if (!message.textContent) onChange({ from: from.value, to: to.value, filters: readFilters() });
  } },
  h('fieldset', null, h('legend', { text: 'Dates' }),
    h('div', { class: 'chips', role: 'group', 'aria-label': 'Date presets' }, presets),
    field('From', from), field('To', to), h('button', { type: 'submit', text: 'Apply' })),
  h('fieldset', null, h('legend', { text: 'Readers' }), controls.map((c) => c.field)),
  h('div', { class: 'segment-end' },
    h('label', { class: 'check', for: compare.id }, compare, h('span', { text: 'Compare with the previous period' })),
    h('button', { type: 'button', class: 'link', text: 'Clear reader filters', onclick: () => onChange({ filters: {} }) })),
  message);

  return {
    el,
    sync(state) {
      message.textContent = '';
      from.value = state.from ?? '';
      to.value = state.to ?? '';
      const preset = state.from && state.to ? matchPreset(state.from, state.to, today()) : state.screen === 'sites' ? '7d' : null;
      for (const b of presets) b.setAttribute('aria-pressed', String(b.dataset.preset === preset));
      for (const c of controls) {
        const v = (state.filters[c.name] ?? []).join(c.el.tagName === 'SELECT' ? ',' : ', ');
        // a link may ask for several devices at once: offer that combination as an option
        if (c.el.tagName === 'SELECT' && v && ![...c.el.options].some((o) => o.value === v)) {
          c.el.append(h('option', { value: v, text: v }));
        }
        c.el.value = v;
      }
      compare.checked = state.compare;
    },
  };
}
