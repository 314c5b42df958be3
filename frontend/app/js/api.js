// The JSON API client: session cookie, CSRF header on writes, RFC 9457 problem details turned into sentences.

const FIELD_WORDS = { from: 'The start date', to: 'The end date' };

// an Error with a message for people; `login` when the user has to sign in again
const apiError = (message, status = 0, errors = []) => Object.assign(new Error(message),
  { status, errors, login: status === 401 });

function problemMessage(status, body) {
  const errors = body?.errors ?? [];
  if (errors.length) {
    return `The request was refused: ${errors.map((e) => (FIELD_WORDS[e.field] ?? e.field) + ' ' + e.message)
      .join('; ')}.`;
  }
  const detail = body?.detail;
  if (status === 403) return 'You have no access to this: ask an administrator for a role on the site.';
  if (status === 404) return `Not found${detail ? ': ' + detail : ''}.`;
  return detail ? detail[0].toUpperCase() + detail.slice(1) + '.' : `The request failed (error ${status}).`;
}

export function createApi(progress) {
  async function call(method, path, body, query, signal) {
    // X-Requested-With: an expired session then gets a plain 401, not the browser's basic-auth dialog
    const headers = { Accept: 'application/json', 'X-Requested-With': 'XMLHttpRequest' };
    const token = document.cookie.match(/(?:^|; )XSRF-TOKEN=([^;]*)/);
    if (method !== 'GET' && token) headers['X-XSRF-TOKEN'] = decodeURIComponent(token[1]);
    // a form (a file upload) goes as multipart, its boundary chosen by the browser
    const form = body instanceof FormData;
    if (body && !form) headers['Content-Type'] = 'application/json';
    progress.start();
    let res;
    try {
      res = await fetch(path + (query ? '?' + query : ''), {
        method, headers, signal, redirect: 'manual', body: form ? body : body && JSON.stringify(body) });
    } catch (e) {
      throw e.name === 'AbortError' ? e : apiError('Foldline could not be reached. Check the connection.');
    } finally {
      progress.done();
    }
    // an ended session sends the browser to the login page; fetch sees that as a redirect
    if (res.type === 'opaqueredirect' || res.status === 401) {
      throw apiError('Your sign-in has ended. Sign in again to continue.', 401);
    }
    const json = res.headers.get('content-type')?.includes('json') ? await res.json().catch(() => null) : null;
    if (!res.ok) throw apiError(problemMessage(res.status, json), res.status, json?.errors);
    return json;
  }
  return {
    get: (path, query, signal) => call('GET', path, null, query, signal),
    post: (path, body) => call('POST', path, body),
    put: (path, body) => call('PUT', path, body),
    delete: (path) => call('DELETE', path),
  };
}
