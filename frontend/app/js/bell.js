// The masthead's bell: unread alert notifications on the sites you can see (GET /api/v1/alerts/unread), asked again
// every minute and after an acknowledgement; it opens the alerts screen of the site with the most unread ones.

import { h } from './dom.js';

export function bell(api, open) {
  const count = h('span.badge#bell-count', { hidden: true });
  const el = h('button.link#bell', { onclick: () => open(el.dataset.site) }, 'Alerts ', count);
  const poll = () => api.get('/api/v1/alerts/unread').then(({ total, bySite }) => {
    el.dataset.site = Object.entries(bySite).sort((a, b) => b[1] - a[1])[0]?.[0] ?? '';
    count.textContent = total;
    count.hidden = !total;
    el.setAttribute('aria-label', `Alerts: ${total} unread`);
  }, () => {});
  poll();
  setInterval(poll, 60_000);
  return { el, poll };
}
