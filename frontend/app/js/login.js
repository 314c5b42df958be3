// The sign-in page: the CSRF token from its cookie into the form, and why the page was shown again.

const cookie = document.cookie.split('; ').find((c) => c.startsWith('XSRF-TOKEN='));
document.querySelector('input[name=_csrf]').value = cookie ? decodeURIComponent(cookie.slice(11)) : '';
const params = new URLSearchParams(location.search);
const message = document.getElementById('login-message');
if (params.has('error')) {
  message.textContent = 'Wrong user name or password (after 5 failures a name waits 15 minutes).';
} else if (params.has('logout')) {
  message.textContent = 'You have signed out.';
  message.className = 'ok';
}
