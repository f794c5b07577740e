// Sets <html data-theme> from the saved choice before the app starts, so a dim room never flashes bright.
// Mirrors src/lib/theme.ts (key, scopes and defaults).
(function () {
  var saved = {};
  try { saved = JSON.parse(localStorage.getItem('ledgerline.theme') || '{}') || {}; } catch (e) { saved = {}; }
  var capture = /^\/cases\/[^/]+\/capture(\/|$)/.test(location.pathname);
  var theme = capture ? saved.capture || 'dim' : saved.general || 'paper';
  document.documentElement.setAttribute('data-theme', theme === 'dim' ? 'dim' : 'paper');
})();
