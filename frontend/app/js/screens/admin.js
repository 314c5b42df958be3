// Global administration: user accounts and teams (roles on a site are given in that site's settings).

import { h } from '../dom.js';
import { heading } from '../screen.js';
import { form, table, section, action } from '../manage.js';

export const id = 'admin';
export const title = 'Administration';

export function render(ctx) {
  const { api } = ctx;
  const users = '/api/v1/admin/users';
  const teams = '/api/v1/admin/teams';
  const enc = encodeURIComponent;
  heading(ctx, 'Administration', 'People and teams. Roles on a site are given in its settings.');
  return Promise.all([
    section(ctx, 'Users', async (reload) => [
      table('users', [['User', (u) => u.username], ['Role', (u) => (u.globalAdmin ? 'global administrator' : 'user')],
        ['Status', (u) => (u.enabled ? 'active' : 'disabled')],
        ['', (u) => u.enabled && u.username !== ctx.me.username && action('Disable', 'Disable ' + u.username,
          () => api.delete(`${users}/${enc(u.username)}`), reload)]], await api.get(users, null, ctx.signal)),
      form('user-form', 'Create user', [['username', 'User name'],
        ['password', 'Password (10 characters or more)', 'password', '', { autocomplete: 'new-password' }],
        ['globalAdmin', 'Global administrator', 'checkbox']], (v) => api.post(users, v), () => reload())]),
    section(ctx, 'Teams', async (reload) => [
      ...(await api.get(teams, null, ctx.signal)).map((t) => h('div.team', { 'data-team': t.name },
        h('h3', t.name),
        h('ul.members', null, t.members.map((m) => h('li', null, m, ' ', action('Remove',
          `Remove ${m} from ${t.name}`, () => api.delete(`${teams}/${t.id}/members/${enc(m)}`), reload)))),
        form('member-form-' + t.id, 'Add to team', [['username', 'User name']],
          (v) => api.post(`${teams}/${t.id}/members`, v), () => reload()))),
      form('team-form', 'Create team', [['name', 'Team name']], (v) => api.post(teams, v), () => reload())]),
  ]);
}
