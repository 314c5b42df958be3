// The segment bar: dates, reader filters, comparison. It only proposes changes of the URL state.

import { h, field, input } from './dom.js';
import { DEVICES, SOURCES, FILTERS } from './state.js';
import { PRESETS, presetRange } from './range.js';

export function segmentBar(onChange, today) {
  const presets = PRESETS.map((p) => h('button.chip', { text: p.label, 'data-preset': p.id,
    onclick: () => onChange({ range: p.id, ...presetRange(p.id, today()) }) }));
  // the browser checks that both dates are there; the server refuses ranges that run backwards or are too long
  const from = input({ type: 'date', name: 'from', required: true });
  const to = input({ type: 'date', name: 'to', required: true });
  const changed = () => onChange({ filters: readFilters() });
  // device and source from fixed lists; the others are labels from event data, comma-separated
  const controls = FILTERS.map((name) => {
    const values = { device: DEVICES, source: SOURCES }[name];
    return values ? h('select#segment-' + name, { name, onchange: changed }, h('option', { value: '', text: 'Any' }),
      values.map((v) => h('option', { value: v, text: v })))
      : input({ name, placeholder: { country: 'PT, ES', region: 'PT-11' }[name] ?? 'any', spellcheck: 'false',
        maxlength: 200, onchange: changed });
  });
  const clear = h('button.tool#segment-clear', { type: 'button', text: 'Clear reader filters',
    onclick: () => onChange({ filters: {} }) });
  const compare = input({ type: 'checkbox', name: 'compare', onchange: () => onChange({ compare: compare.checked }) });

  function readFilters() {
    const filters = {};
    for (const c of controls) {
      const v = c.value.split(',').map((s) => s.trim()).filter(Boolean);
      if (v.length) filters[c.name] = v;
    }
    return filters;
  }

  const el = h('form.segment', { 'aria-label': 'Segment', onsubmit: (e) => {
    e.preventDefault();
    onChange({ range: null, from: from.value, to: to.value, filters: readFilters() });
  } },
  h('fieldset', null, h('legend', 'Dates'),
    h('div.chips', { role: 'group', 'aria-label': 'Date presets' }, presets),
    field('From', from), field('To', to), h('button', { type: 'submit', text: 'Apply' })),
  h('fieldset', null, h('legend', 'Readers'), controls.map((c) => field(c.name[0].toUpperCase() + c.name.slice(1), c)), clear),
  h('label.check', null, compare, 'Compare with the previous period'));

  return {
    el,
    sync(state) {
      from.value = state.from ?? '';
      to.value = state.to ?? '';
      const preset = state.range ?? (state.screen === 'sites' && !state.from && '7d');
      for (const b of presets) b.setAttribute('aria-pressed', b.dataset.preset === preset);
      for (const c of controls) {
        const v = (state.filters[c.name] ?? []).join(c.tagName === 'SELECT' ? ',' : ', ');
        c.value = v;
      }
      clear.disabled = !Object.keys(state.filters).length;
      compare.checked = state.compare;
    },
  };
}
