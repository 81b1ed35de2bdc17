/**
 * A scanned label's first glance. A label opens the Vessel page in a new page load, and on a
 * phone the app's code takes a few hundred milliseconds to start and draw it; the vessel's record,
 * asked for early by index.html's script (shared/early-requests.ts), is usually back well before.
 * When it is, this draws what the person scanned the jug to learn — its name, what is in it and
 * where it stands — over the still-empty page, in plain DOM from the answer's text (never as
 * HTML). The app takes it away once its own page is rendered (src/router/first-glance.ts).
 * No volumes, dates or gravities: their units and style are the person's settings, which only
 * the app applies.
 *
 * Plain ES5 in a string, a part of the early script; the wording follows the Vessel page's.
 */
export const FIRST_GLANCE_ELEMENT_ID = 'first-glance';

export const FIRST_GLANCE_FUNCTION = `function showFirstGlance(answer) {
  function text(tag, className, words) {
    var node = document.createElement(tag);
    node.className = className;
    node.textContent = words;
    return node;
  }
  function draw(vessel) {
    // Too late to help: the app's page (or an earlier glance) is already there.
    if (document.querySelector('[data-test=vessel-title]') || document.getElementById('${FIRST_GLANCE_ELEMENT_ID}')) return;
    var glance = document.createElement('div');
    glance.id = '${FIRST_GLANCE_ELEMENT_ID}';
    glance.className = 'first-glance';
    glance.setAttribute('role', 'status');
    glance.appendChild(document.createElement('div')).className = 'first-glance__bar';
    var page = glance.appendChild(document.createElement('div'));
    page.className = 'cw-page';
    page.appendChild(text('h1', 'cw-page-title', vessel.name)).setAttribute('data-test', 'glance-title');
    var card = page.appendChild(document.createElement('div'));
    card.className = 'q-card cw-card q-pa-md';
    card.appendChild(text('div', 'text-overline cw-muted', 'In it'));
    var batch = vessel.batch && typeof vessel.batch.name === 'string' ? vessel.batch.name : null;
    card.appendChild(text('div', batch ? 'text-h6 first-glance__batch' : 'text-h6 cw-muted', batch || 'Nothing: the vessel is empty'));
    var place = vessel.place;
    var where = place && typeof place.rackName === 'string' ? place.rackName + ' · shelf ' + place.shelfNumber + ' · slot ' + place.slot : 'Not on a shelf';
    card.appendChild(text('div', 'first-glance__place cw-muted', where));
    page.appendChild(text('p', 'q-mt-md cw-muted text-caption', 'Opening the whole record…'));
    document.body.appendChild(glance);
  }
  answer
    .then(function (response) { return response.ok ? response.clone().json() : null; })
    .then(function (vessel) {
      if (!vessel || typeof vessel.name !== 'string') return;
      if (document.body) draw(vessel);
      else document.addEventListener('DOMContentLoaded', function () { draw(vessel); });
    })
    .catch(function () {});
}`;
