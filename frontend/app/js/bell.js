// The alert bell for the masthead (issue #7): unread alert notifications over the sites the user can see, refreshed
// every minute; a click opens the alerts screen of the site with the most unread ones. The shell mounts it:
// `mountBell(api, document.querySelector('.masthead'), (site) => navigate({ screen: 'alerts', site }))`.

import { h } from './dom.js';

export function mountBell(api, container, open, { every = 60_000 } = {}) {
  const count = h('span', { class: 'badge', id: 'alert-bell-count', hidden: true });
  const button = h('button', { type: 'button', class: 'link', id: 'alert-bell', 'aria-live': 'polite',
    text: 'Alerts ', title: 'Unread alert notifications' }, count);
  let bySite = {};
  button.addEventListener('click', () => {
    const [site] = Object.entries(bySite).sort((a, b) => b[1] - a[1])[0] ?? [];
    open(site ? Number(site) : null);
  });
  async function poll() {
    try {
      const unread = await api.get('/api/v1/alerts/unread');
      bySite = unread.bySite ?? {};
      count.textContent = String(unread.total);
      count.hidden = !unread.total;
      button.setAttribute('aria-label', `Alerts: ${unread.total} unread`);
    } catch {
      count.hidden = true;   // the bell stays quiet when the API cannot be reached; the screens say why
    }
  }
  container.append(button);
  poll();
  const timer = setInterval(poll, every);
  return { el: button, poll, stop: () => clearInterval(timer) };
}
