// Test harness for SiteTagBrowserTests (test resources only, never packaged). Query parameters:
//   site, key      the site id and ingest key
//   consent=wait   start the tag in consent mode
//   optout=window  set window.foldlineOptOut; optout=storage sets the localStorage flag
//   idle=<ms>      the tag's inactivity limit; batch=<ms> its batching delay
//   failFetches=n  make the first n fetch calls to the ingest endpoint fail as a network error would
//   install=attributes  configure the tag by data- attributes instead of foldline('init', …)
//   clear=1        clear localStorage and sessionStorage first
(function () {
  var params = new URLSearchParams(location.search);
  if (params.get('clear') === '1') { localStorage.clear(); sessionStorage.clear(); }
  if (params.get('optout') === 'window') window.foldlineOptOut = true;
  if (params.get('optout') === 'storage') localStorage.setItem('foldline.optout', '1');

  // Every call that leaves for the ingest endpoint, by transport, and every body sent.
  var calls = window.testCalls = {fetch: 0, beacon: 0, failed: 0};
  var bodies = window.testBodies = [];
  var failing = Number(params.get('failFetches') || 0);
  var realFetch = window.fetch;
  window.fetch = function (url) {
    if (String(url).indexOf('/events') >= 0) {
      calls.fetch++;
      bodies.push(String(arguments[1] && arguments[1].body));
      if (failing > 0) { failing--; calls.failed++; return Promise.reject(new TypeError('simulated network error')); }
    }
    return realFetch.apply(this, arguments);
  };
  var realBeacon = navigator.sendBeacon;
  navigator.sendBeacon = function (url) {
    if (String(url).indexOf('/events') >= 0) { calls.beacon++; bodies.push(String(arguments[1])); }
    return realBeacon.apply(navigator, arguments);
  };

  // Visibility is simulated in the page (headless Chromium keeps a single tab visible): document.visibilityState
  // and document.hidden are overridden and a visibilitychange event is dispatched, as the browser does.
  var forced = null;
  var real = Object.getOwnPropertyDescriptor(Document.prototype, 'visibilityState').get;
  Object.defineProperty(document, 'visibilityState', {configurable: true,
    get: function () { return forced || real.call(document); }});
  Object.defineProperty(document, 'hidden', {configurable: true,
    get: function () { return document.visibilityState === 'hidden'; }});
  window.testVisibility = function (state) {
    forced = state;
    document.dispatchEvent(new Event('visibilitychange'));
  };

  // An independent record of how long each slot had at least half its pixels in view, so a test can check its own
  // timing before it judges the tag.
  window.testInView = {};
  window.testMaxRatio = {};
  document.addEventListener('DOMContentLoaded', function () {
    var starts = {};
    var io = new IntersectionObserver(function (entries) {
      entries.forEach(function (e) {
        var id = e.target.id;
        window.testMaxRatio[id] = Math.max(window.testMaxRatio[id] || 0, e.intersectionRatio);
        if (e.intersectionRatio >= 0.5) {
          if (starts[id] == null) starts[id] = e.time;
        } else if (starts[id] != null) {
          (window.testInView[id] = window.testInView[id] || []).push(Math.round(e.time - starts[id]));
          starts[id] = null;
        }
      });
    }, {threshold: [0, 0.2, 0.4, 0.5, 0.75, 1]});
    document.querySelectorAll('.ad').forEach(function (el) { io.observe(el); });
  });

  // The installation snippet of docs/tag.md, with the tag served by Foldline on another origin (localhost) than the
  // page (127.0.0.1), so the events cross origins as on a publisher's site. install=attributes uses the form
  // without an inline script: the options as data- attributes of the tag's script element.
  window.foldline = window.foldline || function () { (foldline.q = foldline.q || []).push(arguments); };
  var options = {site: params.get('site'), key: params.get('key')};
  ['consent', 'idle', 'batch'].forEach(function (name) {
    if (params.get(name)) options[name] = params.get(name);
  });
  var tag = document.createElement('script');
  tag.async = true;
  tag.src = location.protocol + '//localhost:' + location.port + '/tag.js';
  if (params.get('install') === 'attributes') {
    Object.keys(options).forEach(function (name) { tag.setAttribute('data-' + name, options[name]); });
  } else {
    foldline('init', options);
  }
  document.head.appendChild(tag);
})();
