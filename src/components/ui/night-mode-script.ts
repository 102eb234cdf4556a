/**
 * The red night mode's page script (NightMode.astro writes it inline, first in <body>, so the remembered
 * choice applies before the page paints; it toggles with the R key outside text fields).
 *
 * It is one of our own inline scripts, so the Content-Security-Policy must allow it by hash: astro.config.mjs
 * hashes this exact text at build time (src/lib/server/csp.ts, README beside it). Plain ES5, no imports.
 */
export const NIGHT_MODE_SCRIPT = `(function () {
  var KEY = 'armilla.ui.nightRed';
  var root = document.documentElement;
  try {
    if (localStorage.getItem(KEY) === '1') root.dataset.night = 'red';
  } catch (e) {}
  function sync() {
    var on = root.dataset.night === 'red';
    document.querySelectorAll('[data-night-toggle]').forEach(function (b) {
      b.setAttribute('aria-pressed', on ? 'true' : 'false');
    });
  }
  function toggle() {
    var on = root.dataset.night !== 'red';
    if (on) root.dataset.night = 'red';
    else delete root.dataset.night;
    try {
      localStorage.setItem(KEY, on ? '1' : '0');
    } catch (err) {}
    document.dispatchEvent(new CustomEvent('armilla:night'));
  }
  document.addEventListener('armilla:night', sync);
  document.addEventListener('DOMContentLoaded', sync);
  document.addEventListener('click', function (e) {
    var b = e.target && e.target.closest ? e.target.closest('[data-night-toggle]') : null;
    if (b) toggle();
  });
  document.addEventListener('keydown', function (e) {
    if ((e.key !== 'r' && e.key !== 'R') || e.ctrlKey || e.metaKey || e.altKey || e.defaultPrevented) return;
    var t = e.target;
    if (t && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT' || t.isContentEditable)) return;
    toggle();
  });
})();`;
