// The JSON API client: session cookie, CSRF header on writes, RFC 9457 problem details turned into sentences.

const FIELD_WORDS = { from: 'The start date', to: 'The end date', date: 'The date', text: 'The note',
  q: 'The search text', minSessions: 'The minimum of sessions' };

/** An API failure with a message for people; `login` when the user has to sign in again. */
export class ApiError extends Error {
  constructor(message, { status = 0, errors = [], login = false } = {}) {
    super(message);
    this.status = status;
    this.errors = errors;
    this.login = login;
  }
}

export function problemMessage(status, body) {
  const errors = Array.isArray(body?.errors) ? body.errors : [];
  if (errors.length) {
    return 'The request was refused: ' + errors.map((e) => `${FIELD_WORDS[e.field] ?? e.field} ${e.message}`)
      .join('; ') + '.';
  }
  const detail = typeof body?.detail === 'string' && body.detail ? body.detail : null;
  if (status === 403) return 'You do not have access to this. Ask an administrator for a role on the site.';
  if (status === 404) return detail ? 'Not found: ' + detail + '.' : 'Not found.';
  if (status >= 500) return `The server could not answer (error ${status}). Try again in a moment; if it keeps `
    + 'happening, tell whoever runs Foldline.';
  return detail ? detail[0].toUpperCase() + detail.slice(1) + '.' : `The request failed (error ${status}).`;
}

function csrfToken() {
  const c = document.cookie.split('; ').find((x) => x.startsWith('XSRF-TOKEN='));
  return c ? decodeURIComponent(c.slice(11)) : null;
}

/** progress.start() and done() frame every request (the loading bar). */
export function createApi(progress) {
  async function call(method, path, { query, body, signal } = {}) {
    // X-Requested-With: an expired session then gets a plain 401, not the browser's basic-auth dialog
    const headers = { Accept: 'application/json', 'X-Requested-With': 'XMLHttpRequest' };
    if (method !== 'GET') {
      const token = csrfToken();
      if (token) headers['X-XSRF-TOKEN'] = token;
      if (body !== undefined) headers['Content-Type'] = 'application/json';
    }
    progress.start();
    let res;
    try {
      res = await fetch(path + (query ? '?' + query : ''), {
        method, headers, signal, redirect: 'manual', credentials: 'same-origin',
        body: body === undefined ? undefined : JSON.stringify(body),
      });
    } catch (e) {
      if (e.name === 'AbortError') throw e;
      throw new ApiError('Foldline could not be reached. Check the connection and try again.');
    } finally {
      progress.done();
    }
    // an ended session sends the browser to the login page; fetch sees that as a redirect
    if (res.type === 'opaqueredirect' || res.status === 401) {
      throw new ApiError('Your sign-in has ended. Sign in again to continue.', { status: 401, login: true });
    }
    if (res.status === 204) return null;
    const json = (res.headers.get('content-type') ?? '').includes('json') ? await res.json().catch(() => null) : null;
    if (!res.ok) throw new ApiError(problemMessage(res.status, json), { status: res.status, errors: json?.errors ?? [] });
    return json;
  }
  return {
    get: (path, query, signal) => call('GET', path, { query, signal }),
    post: (path, body) => call('POST', path, { body }),
    delete: (path) => call('DELETE', path),
  };
}
