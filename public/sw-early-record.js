/*
 * Imported by the service worker (pwa/pwa-plugins.ts). A scanned label lands on a Vessel page,
 * which the worker answers from its precache; the page's early script (shared/early-requests.ts)
 * can ask for the vessel's record only once the new page has been set up and its HTML parsed,
 * some 80 ms later on a laptop and more on a phone. So when the worker serves the app for a
 * Vessel or Batch page, it asks the server for that record at once — the same URL, with the
 * same headers, the early script will ask for — and the worker's own route for records, when
 * the page's request reaches it, is handed this answer instead of asking again: once, within
 * 10 s. Everything else about that route holds: it keeps the answer for use without signal, and
 * when the early request failed (no signal) it answers what it kept.
 */
(function () {
  var ID = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';
  // The page paths whose record the early script asks for, and its URL (shared/early-requests.ts).
  var RECORD_PAGE = new RegExp('^/c/(' + ID + ')/(vessels|batches)/(' + ID + ')/?$');
  var KEPT_FOR_MS = 10000;
  var early = new Map();
  var networkFetch = self.fetch.bind(self);

  function urlOf(input) {
    if (typeof input === 'string') return new URL(input, self.location.href).href;
    return input instanceof URL ? input.href : input.url;
  }

  function methodOf(input, init) {
    return String((init && init.method) || (typeof input === 'object' && input.method) || 'GET').toUpperCase();
  }

  // The worker's routes fetch through the global fetch: an early answer waiting for the URL is taken once.
  self.fetch = function (input, init) {
    var url = urlOf(input);
    var waiting = methodOf(input, init) === 'GET' ? early.get(url) : undefined;
    if (!waiting) return networkFetch(input, init);
    early.delete(url);
    return waiting;
  };

  self.addEventListener('fetch', function (event) {
    if (event.request.mode !== 'navigate') return;
    var page = new URL(event.request.url);
    var record = RECORD_PAGE.exec(page.pathname);
    if (!record || page.origin !== self.location.origin) return;
    var url = page.origin + '/api/cellars/' + record[1] + '/' + record[2] + '/' + record[3];
    var answer = networkFetch(url, { credentials: 'same-origin', headers: { accept: 'application/json' } });
    // Unused or failed, it is simply dropped: the route asks the network (or its cache) itself.
    answer.catch(function () {});
    early.set(url, answer);
    setTimeout(function () {
      if (early.get(url) === answer) early.delete(url);
    }, KEPT_FOR_MS);
  });
})();
