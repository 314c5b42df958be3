// A site's settings, ingest keys and members, for the site's admins.

import { heading } from '../screen.js';
import { form, table, section, action, secret, ok } from '../manage.js';

export const id = 'settings';
export const title = 'Settings';

const FIELDS = [['name', 'Name'], ['domain', 'Domain'], ['timezone', 'Time zone (IANA, e.g. Europe/Lisbon)'],
  ['currency', 'Currency (ISO 4217)'], ['sessionTimeoutMinutes', 'Session ends after idle minutes', 'number'],
  ['engagedSeconds', 'Not a bounce after engaged seconds (optional)', 'number'],
  ['retentionDays', 'Keep raw events for days', 'number']];

export function render(ctx) {
  const { fmt, api, signal } = ctx;
  const base = `/api/v1/sites/${ctx.site.id}`;
  heading(ctx, `${ctx.site.name}: settings`, 'Sessions, retention, ingest keys and members.');
  return Promise.all([
    section(ctx, 'Site', async (reload) => {
      const site = await api.get(base, null, signal);
      return form('site-form', 'Save settings', FIELDS.map(([n, l, t]) => [n, l, t, site[n] ?? '']),
        (v) => api.put(base, v), (saved) => {
          Object.assign(ctx.site, saved);
          reload(ok('Saved.'));
        });
    }),
    section(ctx, 'Ingest keys', async (reload) => [
      table('keys', [['Starts with', (k) => k.prefix], ['Label', (k) => k.label],
        ['Created', (k) => fmt.when(k.createdAt)],
        ['', (k) => action('Revoke', 'Revoke ' + k.prefix, () => api.delete(`${base}/ingest-keys/${k.id}`), reload)]],
      (await api.get(base + '/ingest-keys', null, signal)).filter((k) => !k.revokedAt),
      'No active keys.'),
      form('key-form', 'Create key', [['label', 'Label (where it is used)']],
        (v) => api.post(base + '/ingest-keys', v), (k) => reload(secret('ingest key', k.key)))]),
    section(ctx, 'Members', async (reload) => [
      table('members', [['Name', (m) => m.name], ['Kind', (m) => m.type], ['Role', (m) => m.role],
        ['', (m) => action('Remove', 'Remove ' + m.name, () => api.delete(`${base}/members/${m.type}/${m.id}`),
          reload)]],
      await api.get(base + '/members', null, signal), 'No members.'),
      form('member-form', 'Give role', [['type', 'Kind', ['user', 'team']], ['name', 'User or team name'],
        ['role', 'Role', ['viewer', 'editor', 'admin']]], (v) => api.post(base + '/members', v), () => reload())]),
  ]);
}
