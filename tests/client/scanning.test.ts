import { afterEach, describe, expect, it } from 'vitest';
import { DOMWrapper, flushPromises } from '@vue/test-utils';
import CodeEntry from '@/components/scan/CodeEntry.vue';
import { scanRegion } from '@/components/scan/scan-region';
import ScanPage from '@/pages/ScanPage.vue';
import SignInPage from '@/pages/SignInPage.vue';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, signIn } from './support/fixtures';
import { fieldMessage, mountInApp, pick } from './support/mount-in-app';

afterEach(() => {
  document.body.innerHTML = '';
});

describe('sign-in in front of a label', () => {
  it('says a label is waiting when a label address sent the visitor here', async () => {
    fakeApi().on('GET', '/api/auth/me', { status: 401, body: { error: 'unauthorised', message: 'Sign in first.' } });
    await mountInApp(SignInPage, '/sign-in?next=/s/K7M2P9QX');
    expect(pick('[data-test=sign-in-label-waiting]').textContent).toContain('K7M2P9QX');
  });

  it('says nothing of a label otherwise', async () => {
    fakeApi().on('GET', '/api/auth/me', { status: 401, body: { error: 'unauthorised', message: 'Sign in first.' } });
    await mountInApp(SignInPage, '/sign-in?next=/c/x/today');
    expect(document.querySelector('[data-test=sign-in-label-waiting]')).toBeNull();
  });
});

describe('typing a code', () => {
  it('keeps a code the server refused in the field, selected, with the reason under it', async () => {
    const api = fakeApi();
    signIn(api);
    api.on('GET', /\/api\/scan\//, { status: 404, body: { error: 'not_found', message: 'No such label.' } });
    await mountInApp(ScanPage, `/c/${CELLAR_ID}/scan`);
    const input = pick<HTMLInputElement>('[data-test=scan-code-input]');
    await new DOMWrapper(input).setValue('k7m2p9qa');
    pick('[data-test=scan-code-submit]').click();
    await flushPromises();
    await flushPromises();

    expect(input.value).toBe('K7M2P9QA');
    expect(fieldMessage('[data-test=scan-code-input]')).toContain('No such label here (K7M2P9QA)');
    expect([input.selectionStart, input.selectionEnd]).toEqual([0, 8]);
  });

  it('keeps a code of the wrong shape in the field too', async () => {
    signIn(fakeApi());
    await mountInApp(CodeEntry, `/c/${CELLAR_ID}/scan`, { props: { testId: 'c' } });
    const input = pick<HTMLInputElement>('[data-test=c-input]');
    await new DOMWrapper(input).setValue('K7M2P9Q');
    pick('[data-test=c-submit]').click();
    await flushPromises();
    expect(input.value).toBe('K7M2P9Q');
    expect(fieldMessage('[data-test=c-input]')).toContain('8 letters and digits');
  });
});

describe('the in-app camera', () => {
  it('decodes nearly the whole viewfinder, keeping its shape, not a square at the centre', () => {
    expect(scanRegion(640, 480)).toEqual({ width: 614, height: 460 });
    expect(scanRegion(360, 640)).toEqual({ width: 345, height: 614 });
    // html5-qrcode refuses a region under 50 px.
    expect(scanRegion(40, 40)).toEqual({ width: 50, height: 50 });
  });
});
