// The signed-in user's own account: roles, password, personal API tokens.

import { heading } from '../screen.js';
import { form, table, section, action, secret, ok } from '../manage.js';

export const id = 'account';
export const title = 'Account';

export function render(ctx) {
  const { me, fmt, api } = ctx;
  const url = '/api/v1/me/tokens';
  heading(ctx, 'Your account', `Signed in as ${me.username}` + (me.globalAdmin ? ', a global administrator.'
    : '; roles: ' + ctx.sites.map((s) => `${s.name} (${me.sites[s.id].toLowerCase()})`).join(', ')));
  return Promise.all([
    section(ctx, 'Password', async (reload) => form('password-form', 'Change password', [
      ['currentPassword', 'Current password', 'password', '', { autocomplete: 'current-password' }],
      ['newPassword', 'New password (10 characters or more)', 'password', '', { autocomplete: 'new-password' }]],
    (v) => api.post('/api/v1/me/password', v), () => reload(ok('Your password was changed.')))),
    section(ctx, 'API tokens', async (reload) => [
      table('tokens', [['Name', (t) => t.name], ['Starts with', (t) => t.prefix],
        ['Created', (t) => fmt.when(t.createdAt)], ['Last used', (t) => fmt.when(t.lastUsedAt)],
        ['', (t) => action('Revoke', 'Revoke ' + t.name, () => api.delete(`${url}/${t.id}`), reload)]],
      (await api.get(url, null, ctx.signal)).filter((t) => !t.revokedAt),
      'No tokens. A script sends one as “Authorization: Bearer …”.'),
      form('token-form', 'Create token', [['name', 'Token name']], (v) => api.post(url, v),
        (t) => reload(secret('token', t.token)))]),
  ]);
}
