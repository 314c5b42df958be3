// Bulk imports (issue #8, docs/imports.md): upload an NDJSON or CSV file (editors), and the site's jobs with their
// state, counts and a progress bar, asked again every few seconds while one is queued or reading; cancel, and the
// rejected lines to download.

import { h } from '../dom.js';
import { heading } from '../screen.js';
import { form, table, section, action, ok } from '../manage.js';

export const id = 'imports';
export const title = 'Imports';

const RUNNING = ['queued', 'reading'];

export function render(ctx) {
  const { api, fmt, signal } = ctx;
  const base = `/api/v1/sites/${ctx.site.id}/imports`;
  const editor = ctx.can('EDITOR');
  let jobsReload;
  let timer;
  heading(ctx, `${ctx.site.name}: imports`, 'History as NDJSON events, or CSV with a column mapping; a file imported '
    + 'again stores nothing twice.');
  const upload = editor && section(ctx, 'Import a file', async (reload) => form('import-form', 'Import', [
    ['file', 'File (NDJSON or CSV)', 'file', '', { accept: '.ndjson,.json,.csv,.tsv' }],
    ['format', 'Format', [['', 'from the name'], 'ndjson', 'csv']],
    ['mapping', 'CSV only: the column mapping (JSON: type, columns, delimiter)', 'textarea', '', { rows: 2, cols: 60,
      placeholder: '{"type": "session", "columns": {"id": "session_id", …}}' }]],
  (v) => {
    if (!v.file) throw Object.assign(new Error(''), { errors: [{ field: 'file', message: 'choose a file' }] });
    const body = new FormData();
    for (const [k, x] of Object.entries(v)) if (x) body.append(k, x);
    return api.post(base, body);
  }, (job) => {
    jobsReload();
    reload(ok(`Started: ${job.file}.`));
  }));
  const jobs = section(ctx, 'Jobs', async (reload) => {
    jobsReload = reload;
    const list = await api.get(base, null, signal);
    // while a job runs, ask again in three seconds (a new screen aborts the signal)
    clearTimeout(timer);
    if (list.some((j) => RUNNING.includes(j.state))) {
      timer = setTimeout(() => signal.aborted || reload().catch(() => {}), 3000);
    }
    return table('import-jobs', [
      ['File', (j) => [h('strong', j.file), h('div.quiet', `${j.format}, by ${j.createdBy}, ${fmt.when(j.createdAt)}`)]],
      ['State', (j) => [h('span.badge', { class: /failed|cancelled/.test(j.state) && 'worse', text: j.state }),
        j.cancelRequested && RUNNING.includes(j.state) && ' stopping…', h('div.quiet', j.message)]],
      ['Progress', (j) => [h('progress', { value: j.progress, max: 1, 'aria-label': 'Progress of ' + j.file }), ' ',
        fmt.percent(j.progress, 0), j.estimatedFinish && h('div.quiet', 'ends about ' + fmt.when(j.estimatedFinish))]],
      ['Lines read', (j) => fmt.count(j.linesRead)], ['Stored', (j) => fmt.count(j.stored)],
      ['Already stored', (j) => fmt.count(j.duplicates)],
      ['Rejected', (j) => [fmt.count(j.rejected), ' ', j.rejected > 0 && h('a', { href: j.rejections + '?format=csv',
        download: true, text: 'CSV' })]],
      ['', (j) => editor && RUNNING.includes(j.state) && !j.cancelRequested && action('Cancel', 'Cancel ' + j.file,
        () => api.post(`${base}/${j.id}/cancel`), reload)],
    ], list, 'No imports yet.');
  });
  return Promise.all([upload, jobs]);
}
