/**
 * A scanned label's first glance. A label opens the Vessel page (or, for a bottle case, the
 * Bottles page) in a new page load, and on a phone the app's code takes a few hundred
 * milliseconds to start and draw it; the vessel's or case's record, asked for early by
 * index.html's script (shared/early-requests.ts), is usually back well before. When it is, this
 * draws what the person scanned the label to learn — which jug or case, what is in it and where
 * it stands — over the still-empty page, in plain DOM from the answer's text (never as HTML).
 * The app takes it away once its own page is rendered (src/router/first-glance.ts).
 * No volumes, dates or gravities: their units and style are the person's settings, which only
 * the app applies.
 *
 * Plain ES5 in a string, a part of the early script; the wording follows the Vessel page's.
 */
export const FIRST_GLANCE_ELEMENT_ID = 'first-glance';

export const FIRST_GLANCE_FUNCTION = `function showFirstGlance(answer, kind) {
  function text(tag, className, words) {
    var node = document.createElement(tag);
    node.className = className;
    node.textContent = words;
    return node;
  }
  // What a label's record says at a glance, or null when the answer is not one to show.
  function glanceOf(record) {
    if (kind === 'case') {
      if (typeof record.number !== 'number' || !record.lot || typeof record.lot.batchName !== 'string') return null;
      var left = record.bottlesLeft + ' of ' + record.bottlesInitial + ' bottles left';
      return { title: 'Case ' + record.number, inIt: record.lot.batchName, more: left, place: record.place, shown: '#app .cw-page-title' };
    }
    if (typeof record.name !== 'string') return null;
    var batch = record.batch && typeof record.batch.name === 'string' ? record.batch.name : null;
    return { title: record.name, inIt: batch, more: null, place: record.place, shown: '[data-test=vessel-title]' };
  }
  function draw(seen) {
    // Too late to help: the app's page (or an earlier glance) is already there.
    if (document.querySelector(seen.shown) || document.getElementById('${FIRST_GLANCE_ELEMENT_ID}')) return;
    var glance = document.createElement('div');
    glance.id = '${FIRST_GLANCE_ELEMENT_ID}';
    glance.className = 'first-glance first-glance--' + kind;
    glance.setAttribute('role', 'status');
    glance.appendChild(document.createElement('div')).className = 'first-glance__bar';
    var page = glance.appendChild(document.createElement('div'));
    page.className = 'cw-page';
    page.appendChild(text('h1', 'cw-page-title', seen.title)).setAttribute('data-test', 'glance-title');
    var card = page.appendChild(document.createElement('div'));
    card.className = 'q-card cw-card q-pa-md';
    card.appendChild(text('div', 'text-overline cw-muted', 'In it'));
    card.appendChild(text('div', seen.inIt ? 'text-h6 first-glance__batch' : 'text-h6 cw-muted', seen.inIt || 'Nothing: the vessel is empty'));
    if (seen.more) card.appendChild(text('div', 'first-glance__more', seen.more));
    var place = seen.place;
    var where = place && typeof place.rackName === 'string' ? place.rackName + '\u00a0· shelf\u00a0' + place.shelfNumber + '\u00a0· slot\u00a0' + place.slot : 'Not on a shelf';
    card.appendChild(text('div', 'first-glance__place cw-muted', where));
    page.appendChild(text('p', 'q-mt-md cw-muted text-caption', 'Opening the whole record…'));
    document.body.appendChild(glance);
  }
  answer
    .then(function (response) { return response.ok ? response.clone().json() : null; })
    .then(function (record) {
      var seen = record && glanceOf(record);
      if (!seen) return;
      if (document.body) draw(seen);
      else document.addEventListener('DOMContentLoaded', function () { draw(seen); });
    })
    .catch(function () {});
}`;
