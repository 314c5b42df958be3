// On every screen of a site: copy the address, and save the screen with its segment as a named view (editors).

import { h } from './dom.js';
import { ANALYSIS, viewState } from './state.js';
import { form, copyable } from './manage.js';

export function viewTools({ can, state, site, api }) {
  const out = h('div.view-out', { role: 'status' });
  // the address in a field too, for browsers that refuse the clipboard
  const show = (text, url) => out.replaceChildren(text, ' ', copyable(url, 'Link', 'link-text'));
  return h('div.view-tools', null, can('EDITOR') && ANALYSIS.includes(state.screen) && h('button.tool#save-view', {
    text: 'Save view', onclick: () => {
      out.replaceChildren(form('save-form', 'Save', [['name', 'Name of the view', 'text', '', { maxlength: 120 }],
        ['shared', 'Shared with everyone who can see this site', 'checkbox', true]],
      (v) => api.post(`/api/v1/sites/${site.id}/views`, { ...v, screen: state.screen, state: viewState(state) }),
      (view) => show(`Saved “${view.name}”.`, location.origin + view.link)));
      out.querySelector('input').focus();
    } }), ' ', h('button.tool#copy-link', { text: 'Copy link', onclick: async () => {
    try {
      await navigator.clipboard.writeText(location.href);
      show('Link copied.', location.href);
    } catch {
      show('Copy this link:', location.href);
      out.lastChild.select();
    }
  } }), out);
}
