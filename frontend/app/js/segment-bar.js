// The segment bar: date range (presets and custom), reader filters and the comparison, on every screen.
// It only reads and writes the URL state; the screen re-renders from the new state.

import { h, uid } from './dom.js';
import { DEVICES, SOURCES, FILTERS } from './state.js';
import { PRESETS, presetRange, matchPreset, isIsoDate, daysIn } from './range.js';

const TEXT_FILTERS = [
  { name: 'country', label: 'Country', hint: 'PT, ES' },
  { name: 'region', label: 'Region', hint: 'PT-11' },
  { name: 'browser', label: 'Browser', hint: 'any' },
  { name: 'variant', label: 'Variant', hint: 'any' },
];

const list = (text) => text.split(',').map((s) => s.trim()).filter(Boolean);

/**
 * @param onChange (changes) => void, called with the state fields to change
 * @param today    () => the site's today as YYYY-MM-DD
 */
export function segmentBar(onChange, today) {
  const presetButtons = PRESETS.map((p) => h('button', {
    type: 'button', class: 'chip', 'data-preset': p.id, text: p.label, 'aria-pressed': 'false',
    onclick: () => onChange(presetRange(p.id, today())),
  }));
  const from = h('input', { type: 'date', name: 'from', id: uid('from'), required: true });
  const to = h('input', { type: 'date', name: 'to', id: uid('to'), required: true });
  const choice = (name, label, values) => {
    const id = uid(name);
    const sel = h('select', { id, name, onchange: () => onChange({ filters: readFilters() }) },
      h('option', { value: '', text: 'Any' }), values.map((v) => h('option', { value: v, text: v })));
    return { sel, field: h('label', { class: 'field', for: id }, h('span', { text: label }), sel) };
  };
  const device = choice('device', 'Device', DEVICES);
  const source = choice('source', 'Source', SOURCES);
  const texts = TEXT_FILTERS.map((f) => {
    const id = uid(f.name);
    const input = h('input', { type: 'text', id, name: f.name, placeholder: f.hint, autocomplete: 'off',
      spellcheck: 'false', maxlength: '200', onchange: () => onChange({ filters: readFilters() }) });
    return { ...f, input, field: h('label', { class: 'field', for: id }, h('span', { text: f.label }), input) };
  });
  const compareId = uid('compare');
  const compare = h('input', { type: 'checkbox', id: compareId, name: 'compare',
    onchange: () => onChange({ compare: compare.checked }) });
  const message = h('p', { class: 'segment-message', role: 'alert' });

  function readFilters() {
    const filters = {};
    if (device.sel.value) filters.device = device.sel.value.split(',');
    if (source.sel.value) filters.source = source.sel.value.split(',');
    for (const t of texts) {
      const v = list(t.input.value);
      if (v.length) filters[t.name] = v;
    }
    return filters;
  }

  const el = h('form', { class: 'segment', 'aria-label': 'Segment', novalidate: true,
    onsubmit: (e) => {
      e.preventDefault();
      message.textContent = '';
      if (!isIsoDate(from.value) || !isIsoDate(to.value)) {
        message.textContent = 'Enter both dates as complete dates.';
      } else if (from.value > to.value) {
        message.textContent = 'The start date must not be after the end date.';
      } else if (daysIn(from.value, to.value) > 400) {
        message.textContent = 'A range can cover at most 400 days.';
      } else {
        onChange({ from: from.value, to: to.value, filters: readFilters() });
      }
    } },
  h('fieldset', { class: 'dates' }, h('legend', { text: 'Dates' }),
    h('div', { class: 'chips', role: 'group', 'aria-label': 'Date presets' }, presetButtons),
    h('label', { class: 'field', for: from.id }, h('span', { text: 'From' }), from),
    h('label', { class: 'field', for: to.id }, h('span', { text: 'To' }), to),
    h('button', { type: 'submit', class: 'apply', text: 'Apply' })),
  h('fieldset', { class: 'readers' }, h('legend', { text: 'Readers' }),
    device.field, source.field, texts.map((t) => t.field)),
  h('div', { class: 'segment-end' },
    h('label', { class: 'check', for: compareId }, compare, h('span', { text: 'Compare with the previous period' })),
    h('button', { type: 'button', class: 'link', text: 'Clear reader filters',
      onclick: () => onChange({ filters: {} }) })),
  message);

  const setChoice = ({ sel }, values) => {
    const v = (values ?? []).join(',');
    if (v && ![...sel.options].some((o) => o.value === v)) sel.append(h('option', { value: v, text: v }));
    sel.value = v;
  };

  return {
    el,
    /** Shows the given state in the controls (after navigation, back/forward or a pasted link). */
    sync(state) {
      message.textContent = '';
      from.value = state.from ?? '';
      to.value = state.to ?? '';
      const preset = state.from && state.to ? matchPreset(state.from, state.to, today()) : state.screen === 'sites' ? '7d' : null;
      for (const b of presetButtons) b.setAttribute('aria-pressed', String(b.dataset.preset === preset));
      setChoice(device, state.filters.device);
      setChoice(source, state.filters.source);
      for (const t of texts) t.input.value = (state.filters[t.name] ?? []).join(', ');
      compare.checked = state.compare;
    },
  };
}

export { FILTERS };
