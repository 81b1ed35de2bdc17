/**
 * The first page of a visit asks the server for the session and its main record only after the
 * client's JavaScript has loaded and run. This small script, inlined in index.html's <head>, starts
 * those GETs while the JavaScript loads; `src/api/early-requests.ts` hands each answer to the first
 * `request()` for the same URL. A scanned label (→ the Vessel page) is the case it is for.
 *
 * Plain ES5 in a string: it runs before any module, and the server allows exactly this text by
 * its hash in the Content-Security-Policy (server/app.ts), so it must not change at build.
 */
export const EARLY_REQUESTS_GLOBAL = '__cellarwrightEarly';

export const EARLY_REQUESTS_SCRIPT = `(function () {
  var early = (window.${EARLY_REQUESTS_GLOBAL} = {});
  function get(url) {
    var answer = fetch(url, { credentials: 'same-origin', headers: { accept: 'application/json' } });
    answer.catch(function () {});
    early[url] = answer;
  }
  get('/api/auth/me');
  var id = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';
  var cellar = new RegExp('^/c/(' + id + ')(/|$)').exec(location.pathname);
  if (!cellar) return;
  get('/api/cellars/' + cellar[1] + '/settings');
  var record = new RegExp('^/c/' + id + '/(vessels|batches)/(' + id + ')/?$').exec(location.pathname);
  if (record) get('/api/cellars/' + cellar[1] + '/' + record[1] + '/' + record[2]);
})();`;
