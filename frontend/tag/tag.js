/*! Foldline site tag: see docs/tag.md. No cookies. */
(function (w, d) {
  'use strict';
  var old = w.foldline;
  if (old && old.loaded) return;

  var P = 'foldline.';
  var nav = navigator;
  var me = d.currentScript;
  var cfg = {slots: '[data-ad-slot]', consent: 'granted', idle: 5000, batch: 1000, session: 30};
  var consent = null; // until foldline('consent', true|false)
  var on = false, heard = false, q = [], pg = null, pend = [];
  var io, ro, timer = 0, busy = false, backoff = 0;
  var eng = 0, since = 0, last = 0; // engaged ms; start of the running stretch; last activity
  var prevUrl;

  var now = () => performance.now();
  var visible = () => d.visibilityState !== 'hidden';

  function store(kind) {
    try { var s = w[kind]; s.getItem(P); return s; } catch (e) { return null; } // no test write: nothing before consent
  }
  var ls = store('localStorage'), ss = store('sessionStorage');
  function get(s, k) { try { return s ? s.getItem(P + k) : null; } catch (e) { return null; } }
  function put(s, k, v) {
    try { if (s) { if (v == null) s.removeItem(P + k); else s.setItem(P + k, v); } } catch (e) { /* blocked */ }
  }

  function rid() {
    return Array.from(crypto.getRandomValues(new Uint32Array(4)), n => ('000000' + n.toString(36)).slice(-7)).join('');
  }

  function allowed() {
    return !!(cfg.site && cfg.key) && w.foldlineOptOut !== true && get(ls, 'optout') !== '1'
        && (consent === true || (consent === null && cfg.consent !== 'wait'));
  }

  // ---- sending: NDJSON batches by fetch, retried; by sendBeacon when the page goes away ----
  function url() {
    return String(cfg.endpoint || '').replace(/\/+$/, '') + '/api/v1/sites/' + encodeURIComponent(cfg.site)
        + '/events?key=' + encodeURIComponent(cfg.key);
  }
  function nd(events) { return events.map(e => JSON.stringify(e)).join('\n'); }
  function save() { put(ss, 'q' + cfg.site, q.length ? JSON.stringify(q) : null); }
  function later(ms) { if (!timer) timer = setTimeout(send, ms); }

  function push(ev) {
    if (!on || !allowed()) return;
    q.push(ev);
    if (q.length > 500) q.splice(0, q.length - 500);
    save();
    later(+cfg.batch);
  }

  function send() {
    clearTimeout(timer);
    timer = 0;
    if (busy || !q.length || !allowed()) return;
    var batch = q.slice(0, 50), ok = false;
    busy = true;
    // key in the query and a text/plain body: no CORS preflight, as for a beacon
    fetch(url(), {method: 'POST', body: nd(batch), keepalive: true, credentials: 'omit'})
      .then(r => { ok = r.ok || (r.status >= 400 && r.status < 500 && r.status !== 408 && r.status !== 429); })
      .catch(() => { /* retried */ })
      .then(() => {
        busy = false;
        if (ok) {
          q = q.filter(e => batch.indexOf(e) < 0);
          save();
          backoff = 0;
        } else {
          backoff = Math.min(60000, backoff * 2 || 1000);
        }
        if (q.length) later(ok ? 0 : backoff);
      });
  }

  function beacon() {
    while (q.length && allowed()) {
      var part = q.slice(0, 50);
      if (!nav.sendBeacon || !nav.sendBeacon(url(), nd(part))) { save(); send(); return; }
      q = q.slice(part.length);
    }
    save();
  }

  // ---- engaged time: visible and active; a stretch ends `idle` ms after the last activity ----
  function engaged(t) { return eng + (since ? Math.min(t, last + +cfg.idle) - since : 0); }

  function activity(e) {
    if (!on || !visible()) return;
    var t = now();
    if (since && t - last > cfg.idle) { eng += last + +cfg.idle - since; since = 0; }
    last = t;
    if (!since) since = t;
    if (!e || e.type === 'scroll') depth();
  }

  function depth() {
    var h = Math.max(d.documentElement.scrollHeight, d.body ? d.body.scrollHeight : 0);
    if (h) pg.sc = Math.max(pg.sc, Math.min(100, Math.round((w.scrollY + w.innerHeight) / h * 100)));
  }

  function pause(t) {
    if (since) { eng = engaged(t); since = 0; }
    pg.slots.forEach(s => disarm(s, t));
  }

  // ---- viewability (MRC display): >= 50% of the pixels in view for >= 1 continuous second ----
  function match(s, ref) { return typeof ref === 'string' ? s.n === ref : s.el === ref || s.el.contains(ref); }
  function find(ref) {
    if (pg && ref) for (var i = 0; i < pg.slots.length; i++) if (match(pg.slots[i], ref)) return pg.slots[i];
    return null;
  }

  function add(el) {
    if (pg.slots.some(s => s.el === el)) return;
    var i = pg.slots.length + 1;
    var s = {el: el, i: i, n: String(el.getAttribute('data-ad-slot') || el.id || i).slice(0, 64), r: 0, st: 0};
    pg.slots.push(s);
    if (io) io.observe(el);
    if (ro) ro.observe(el);
    pend = pend.filter(p => {
      if (!match(s, p[0])) return true;
      apply(s, p[1]);
      return false;
    });
  }

  function seen(entries) {
    if (!on || !pg) return;
    entries.forEach(e => {
      var s = pg.slots.find(x => x.el === e.target), b = e.boundingClientRect;
      if (!s) return;
      s.r = b.width * b.height > 0 ? e.intersectionRatio : 0; // empty slot: not in view
      if (s.r >= 0.5) { if (!s.st && visible()) arm(s, e.time); } else disarm(s, e.time);
    });
  }

  function arm(s, t) {
    s.st = t;
    clearTimeout(s.tm);
    s.tm = setTimeout(() => check(s), Math.max(0, 1000 - (now() - t)));
  }

  function check(s) {
    if (io) seen(io.takeRecords()); // exits observed but not yet delivered
    if (!s.st) return;
    var r = s.el.getBoundingClientRect();
    var x = Math.max(0, Math.min(r.right, w.innerWidth) - Math.max(r.left, 0));
    var y = Math.max(0, Math.min(r.bottom, w.innerHeight) - Math.max(r.top, 0));
    if (x * y * 2 < r.width * r.height) { s.st = 0; return; } // left, not yet reported
    var left = 1000 - (now() - s.st);
    if (left <= 0) s.v = true;
    else s.tm = setTimeout(() => check(s), left);
  }

  function disarm(s, t) {
    if (s.st && t - s.st >= 1000) s.v = true;
    s.st = 0;
    clearTimeout(s.tm);
  }

  function revenue(ref, o) {
    var s = find(ref);
    if (s) apply(s, o || {});
    else if (pend.length < 100) pend.push([ref, o || {}]);
  }

  function apply(s, o) {
    var cpm = o.cpmMicros, rev = o.revenueMicros;
    if (cpm >= 0) s.cpm = Math.round(cpm);
    s.rev = Math.round(rev >= 0 ? rev : cpm >= 0 ? cpm / 1000 : 0);
    if (/^\d{1,5}x\d{1,5}$/.test(o.size)) s.size = o.size;
  }

  function clicked(ref) {
    var s = find(ref);
    if (s) s.c = true;
  }

  function impression(s) {
    var r = s.el.getBoundingClientRect();
    if (!s.size && r.width >= 1 && r.height >= 1) s.size = Math.round(r.width) + 'x' + Math.round(r.height);
    return {type: 'impression', id: pg.id + '.' + s.i, pageview: pg.id, slot: s.n, size: s.size, viewable: !!s.v,
      clicked: !!s.c, revenueMicros: s.rev || 0, cpmMicros: s.cpm};
  }

  // ---- device, browser, system: generic rules, no product names ----
  function device() {
    var ua = nav.userAgent, m = w.matchMedia;
    if (/Tablet/i.test(ua)) return 'tablet';
    if (/Mobi/.test(ua) || (nav.userAgentData && nav.userAgentData.mobile)) return 'phone';
    if (m && m('(pointer: coarse)').matches) return Math.min(screen.width, screen.height) < 600 ? 'phone' : 'tablet';
    return 'desktop';
  }

  function browser() {
    var b = nav.userAgentData && nav.userAgentData.brands, t;
    if (b && b.length) {
      // all brands but the meaningless one ("Not?A_Brand")
      t = b.map(x => x.brand).filter(n => !/not.?a.?brand/i.test(n));
      if (t.length) return t.sort().join(' / ').slice(0, 64);
    }
    // no brand list (other engines, or not HTTPS): last product token
    t = (nav.userAgent.match(/[A-Za-z][\w-]*(?=\/\d)/g) || []).filter(n => n !== 'Mobile');
    return t.length ? t[t.length - 1].slice(0, 64) : undefined;
  }

  function os() {
    var p = nav.userAgentData && nav.userAgentData.platform, m;
    if (p) return p.slice(0, 64);
    m = /\(([^;)]+)/.exec(nav.userAgent);
    return m ? m[1].replace(/\s+[\d._]+$/, '').slice(0, 64) : undefined;
  }

  function variant() {
    var m = d.querySelector('meta[name="foldline-variant"]');
    var v = cfg.variant || d.documentElement.getAttribute('data-variant') || (m && m.content);
    return v ? String(v).slice(0, 64) : undefined;
  }

  // path with only utm_* kept: other parameters may be personal
  function here() {
    var keep = [];
    location.search.slice(1).split('&').forEach(p => { if (/^utm_/.test(p)) keep.push(p); });
    return (location.pathname + (keep.length ? '?' + keep.join('&') : '')).slice(0, 2048);
  }

  function origin(r) {
    try { var u = new URL(r); return (u.origin + u.pathname).slice(0, 2048); } catch (e) { return undefined; }
  }

  // ---- page lifecycle ----
  function session() {
    var t = Date.now(), s = (get(ls, 's') || '').split('.'), id = s[0];
    if (!id || !(t - s[1] < cfg.session * 60000)) id = rid().slice(0, 20);
    put(ls, 's', id + '.' + t);
    return id;
  }

  function newPage(path) {
    var visitor = get(ls, 'v') || rid(), els = d.querySelectorAll(cfg.slots);
    put(ls, 'v', visitor);
    if (io) io.disconnect();
    if (ro) ro.disconnect();
    eng = since = 0;
    pg = {id: rid(), sid: session(), slots: [], sc: 0, end: -1};
    io = w.IntersectionObserver && new IntersectionObserver(seen, {threshold: [0, 0.5, 1]});
    // a resized slot (an ad filled it) is measured afresh
    ro = w.ResizeObserver && new ResizeObserver(es => {
      es.forEach(e => { if (io) { io.unobserve(e.target); io.observe(e.target); } });
    });
    els.forEach(add);
    push({type: 'pageview', id: pg.id, ts: Date.now(), visitor: visitor, session: pg.sid, path: path || here(),
      referrer: origin(prevUrl || d.referrer), source: cfg.source, device: device(), browser: browser(), os: os(),
      country: cfg.country, region: cfg.region, variant: variant(), ads: Math.min(100, els.length)});
    prevUrl = location.href;
    activity();
  }

  // pageend and impressions, again when changed (Foldline keeps the largest pageend, the first impression)
  function leave() {
    if (!pg) return;
    var ms = Math.round(engaged(now()));
    if (ms !== pg.end) {
      pg.end = ms;
      push({type: 'pageend', pageview: pg.id, engagedMs: ms, scrollPct: pg.sc});
    }
    pg.slots.forEach(s => {
      var ev = impression(s), json = JSON.stringify(ev);
      if (json !== s.sent) { s.sent = json; push(ev); }
    });
    put(ls, 's', pg.sid + '.' + Date.now());
  }

  function hide() {
    if (!on) return;
    pause(now());
    leave();
    beacon();
  }

  function listen() {
    if (heard) return;
    heard = true;
    var o = {capture: true, passive: true};
    'scroll keydown pointerdown pointermove touchstart wheel'.split(' ').forEach(t => {
      w.addEventListener(t, activity, o);
    });
    d.addEventListener('visibilitychange', () => {
      if (!visible()) return hide();
      if (!on) return;
      activity();
      var t = now();
      pg.slots.forEach(s => { if (s.r >= 0.5 && !s.st) arm(s, t); });
    });
    w.addEventListener('pagehide', hide);
    w.addEventListener('pageshow', e => { if (e.persisted && on) newPage(); }); // from bfcache
    d.addEventListener('click', e => { if (on) clicked(e.target); }, true);
    // a click into an ad iframe blurs the window
    w.addEventListener('blur', () => {
      setTimeout(() => {
        var f = d.activeElement;
        if (on && f && f.tagName === 'IFRAME') clicked(f);
      });
    });
  }

  function start() {
    if (on || !allowed()) return;
    if (d.readyState === 'loading') { d.addEventListener('DOMContentLoaded', start); return; }
    if (d.prerendering) { d.addEventListener('prerenderingchange', start); return; }
    on = true;
    listen();
    try { q = JSON.parse(get(ss, 'q' + cfg.site)) || []; } catch (e) { q = []; } // unsent, earlier page
    newPage();
  }

  // consent withdrawn or opt-out: stop, drop the queue, forget the ids
  function stop() {
    on = false;
    q = [];
    clearTimeout(timer);
    timer = 0;
    if (pg) pg.slots.forEach(s => clearTimeout(s.tm));
    if (io) io.disconnect();
    if (ro) ro.disconnect();
    pg = null;
    put(ls, 'v', null);
    put(ls, 's', null);
    put(ss, 'q' + cfg.site, null);
  }

  function api(cmd, a, b) {
    try {
      if (cmd === 'init') { for (var k in a) cfg[k] = a[k]; start(); }
      else if (cmd === 'consent') { consent = a !== false; if (consent) start(); else stop(); }
      else if (cmd === 'optout') { put(ls, 'optout', '1'); stop(); }
      else if (cmd === 'optin') { put(ls, 'optout', null); start(); }
      else if (cmd === 'revenue') revenue(a, b);
      else if (cmd === 'click') clicked(a);
      else if (cmd === 'scan') { if (pg) d.querySelectorAll(cfg.slots).forEach(add); }
      else if (cmd === 'pageview') { if (on) { pause(now()); leave(); send(); newPage(a); } }
      else if (cmd === 'flush') send();
    } catch (e) { /* never break the page */ }
  }

  if (me) {
    'site key endpoint slots consent variant source country region idle batch session'.split(' ').forEach(k => {
      var v = me.getAttribute('data-' + k);
      if (v != null) cfg[k] = v;
    });
    if (me.src) cfg.endpoint = cfg.endpoint || new URL(me.src).origin;
  }
  api.loaded = true;
  w.foldline = api;
  ((old && old.q) || []).forEach(args => { api.apply(null, args); });
  start();
})(window, document);
