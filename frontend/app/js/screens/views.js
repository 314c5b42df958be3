// The site's saved views: pinned first, with owner and when last opened; open, pin for the team, delete.

import { h } from '../dom.js';
import { heading } from '../screen.js';
import { table, section, action } from '../manage.js';

export const id = 'views';
export const title = 'Saved views';

export function render(ctx) {
  heading(ctx, 'Saved views', 'A view keeps a screen with its filters and dates; “last 28 days” stays relative.');
  const base = `/api/v1/sites/${ctx.site.id}/views`;
  return section(ctx, 'Views', async (reload) => table('view-list', [
    ['Name', (v) => [h('a', { href: v.link, text: v.name }), v.pinned && ' ★ pinned']],
    ['Screen', (v) => [v.screen, h('div.quiet', v.state)]],
    ['Owner', (v) => v.owner + (v.owner === ctx.me.username ? ' (you)' : '')],
    ['Shared', (v) => (v.shared ? 'with the site' : 'no, private')],
    ['Last opened', (v) => ctx.fmt.when(v.lastOpenedAt)],
    ['', (v) => [ctx.can('EDITOR') && action(v.pinned ? 'Unpin' : 'Pin', 'Pin or unpin ' + v.name,
      () => ctx.api.post(`${base}/${v.id}/pin`, { pinned: !v.pinned }), reload), ' ',
    (v.owner === ctx.me.username || ctx.can('ADMIN')) && action('Delete', 'Delete ' + v.name, () => confirm(
      `Delete the view “${v.name}”? Its link will then say it was deleted.`) && ctx.api.delete(`${base}/${v.id}`),
    reload)]],
  ], await ctx.api.get(base, null, ctx.signal), 'None yet: use “Save view” on a screen.'));
}
