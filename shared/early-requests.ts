/**
 * The first page of a visit asks the server for the session and its main record only after the
 * client's JavaScript has loaded and run, and fetches the page's own code only then too. This
 * small script, inlined in index.html's <head>, starts both while the entry script loads:
 * - GETs of the session, the cellar's settings and a Vessel or Batch page's record (or a scanned
 *   case's), whose answers `src/api/early-requests.ts` hands to the first `request()` for the
 *   same URL;
 * - preloads of the layout's and the page's code, listed at build time in the JSON block
 *   `#page-files` (pwa/first-load.ts) — a data block, which runs nothing.
 * - for a vessel, or a case opened on the Bottles page, its first glance once the record is back
 *   (shared/first-glance-script.ts).
 * A scanned label (→ the Vessel page, or the Bottles page on a case) is the case it is for.
 *
 * Plain ES5 in a string: it runs before any module. The server allows the inline scripts of the
 * index.html it serves by their hashes (server/http/inline-script-hashes.ts).
 */
import { FIRST_GLANCE_FUNCTION } from './first-glance-script';

export const EARLY_REQUESTS_GLOBAL = '__cellarwrightEarly';

/** The id of the JSON block listing each page's files: { layout: [...], vessel: [...], … }. */
export const PAGE_FILES_ELEMENT_ID = 'page-files';

export const EARLY_REQUESTS_SCRIPT = `(function () {
  var early = (window.${EARLY_REQUESTS_GLOBAL} = {});
  function get(url) {
    var answer = fetch(url, { credentials: 'same-origin', headers: { accept: 'application/json' } });
    answer.catch(function () {});
    early[url] = answer;
  }
  var listed = document.getElementById('${PAGE_FILES_ELEMENT_ID}');
  var files = {};
  try { files = listed ? JSON.parse(listed.textContent) : {}; } catch (e) {}
  // Written into the document while it is parsed, so the parser fetches them at once (links
  // appended from script start only after the entry module has run). Names come from the build.
  // One write for all of them: each write re-enters the parser, a few hundred microseconds apiece.
  var links = [];
  var listedOnce = {};
  function preload(page) {
    (files[page] || []).forEach(function (file) {
      if (listedOnce[file] || !/^assets\\/[\\w.-]+$/.test(file)) return;
      listedOnce[file] = true;
      var kind = /\\.css$/.test(file) ? 'rel="preload" as="style"' : 'rel="modulepreload"';
      links.push('<link ' + kind + ' crossorigin href="/' + file + '">');
    });
  }
  get('/api/auth/me');
  var id = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';
  var cellar = new RegExp('^/c/(' + id + ')(/|$)').exec(location.pathname);
  if (!cellar) return;
  get('/api/cellars/' + cellar[1] + '/settings');
  preload('layout');
  var record = new RegExp('^/c/' + id + '/(vessels|batches)/(' + id + ')/?$').exec(location.pathname);
  if (record) {
    var recordUrl = '/api/cellars/' + cellar[1] + '/' + record[1] + '/' + record[2];
    get(recordUrl);
    preload(record[1] === 'vessels' ? 'vessel' : 'batch');
    // A vessel is what a scanned label opens: its name and contents as soon as they are here.
    if (record[1] === 'vessels') showFirstGlance(early[recordUrl], 'vessel');
  } else if (/^\\/c\\/[^/]+\\/bottles\\/?$/.test(location.pathname)) {
    preload('bottles');
    // A scanned case label (/bottles?case=…): the case, its batch and its place as soon as they are here.
    var scannedCase = new RegExp('[?&]case=(' + id + ')(&|$)').exec(location.search);
    if (scannedCase) {
      var caseUrl = '/api/cellars/' + cellar[1] + '/cases/' + scannedCase[1];
      get(caseUrl);
      showFirstGlance(early[caseUrl], 'case');
    }
  } else if (/^\\/c\\/[^/]+\\/today\\/?$/.test(location.pathname)) {
    preload('today');
  }
  if (links.length) document.write(links.join(''));
  ${FIRST_GLANCE_FUNCTION}
})();`;
