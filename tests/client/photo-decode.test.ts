import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';

// The two readers (html5-qrcode, then jsQR) are stand-ins whose answers each test sets: what is
// checked is how the component tells a read code, an unreadable photo and a reader that never
// loaded apart. Each test loads the component afresh after choosing what loading gives.
// (That the real readers read a real photo is the browser test's job: tests/e2e/scan.test.ts.)
const readers = {
  firstLoads: true,
  first: async (): Promise<string> => '',
  second: (): { data: string } | null => null,
};
// One mock per module, registered once per test: a second vi.doMock of the same module before an
// import can lose to the first when the machine is busy.
const html5QrcodeStandIn = () => {
  if (!readers.firstLoads) throw new TypeError('Failed to fetch dynamically imported module');
  return {
    Html5Qrcode: class {
      scanFile = () => readers.first();
      clear = () => undefined;
    },
  };
};
const jsQrStandIn = () => ({ default: () => readers.second() });
const missed = async (): Promise<string> => {
  throw new Error('No MultiFormat Readers were able to detect the code.');
};

beforeEach(() => {
  readers.firstLoads = true;
  vi.resetModules();
  vi.doMock('html5-qrcode', html5QrcodeStandIn);
  vi.doMock('jsqr', jsQrStandIn);
  // happy-dom draws nothing: a blank bitmap and a blank canvas stand in for the photo's pixels.
  vi.stubGlobal('createImageBitmap', async () => ({ width: 40, height: 30, close: () => undefined }));
  vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue({
    drawImage: () => undefined,
    getImageData: (_x: number, _y: number, w: number, h: number) => ({ data: new Uint8ClampedArray(w * h * 4) }),
  } as unknown as CanvasRenderingContext2D);
});
afterEach(() => {
  document.body.innerHTML = '';
  vi.doUnmock('html5-qrcode');
  vi.doUnmock('jsqr');
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

async function pickPhoto() {
  const { default: PhotoDecode } = await import('@/components/scan/PhotoDecode.vue');
  const wrapper = mount(PhotoDecode, { attachTo: document.body, global: { plugins: [Quasar] } });
  const input = wrapper.find<HTMLInputElement>('[data-test=photo-file]');
  Object.defineProperty(input.element, 'files', { value: [new File(['png'], 'label.png', { type: 'image/png' })] });
  await input.trigger('change');
  const error = () => wrapper.find('[data-test=photo-error]');
  // Loading a reader is a dynamic import, which takes longer on a busy machine: wait for the outcome.
  await vi.waitFor(() => {
    if (!wrapper.emitted('decoded') && !error().exists()) throw new Error('the photo is still being read');
  });
  await flushPromises();
  return { wrapper, error };
}

describe('reading a label from a photo', () => {
  it('hands on the text of the code the first reader read, with no message', async () => {
    readers.first = async () => 'https://cellar.example.test/s/K7M2P9QX';
    readers.second = () => ({ data: 'not asked' });
    const { wrapper, error } = await pickPhoto();
    expect(wrapper.emitted('decoded')).toEqual([['https://cellar.example.test/s/K7M2P9QX']]);
    expect(error().exists()).toBe(false);
  });

  it('hands on what the second reader read when the first found nothing', async () => {
    readers.first = missed;
    readers.second = () => ({ data: 'https://cellar.example.test/s/BSUNZ5VL' });
    const { wrapper, error } = await pickPhoto();
    expect(wrapper.emitted('decoded')).toEqual([['https://cellar.example.test/s/BSUNZ5VL']]);
    expect(error().exists()).toBe(false);
  });

  it('asks for a better photo when neither reader finds a code in it', async () => {
    readers.first = missed;
    readers.second = () => null;
    const { wrapper, error } = await pickPhoto();
    expect(wrapper.emitted('decoded')).toBeUndefined();
    expect(error().text()).toContain('No QR code found in that photo');
  });

  it('says the reader could not be loaded, not that the photo is bad, when its code never arrives', async () => {
    readers.firstLoads = false;
    const { wrapper, error } = await pickPhoto();
    expect(wrapper.emitted('decoded')).toBeUndefined();
    expect(error().text()).toBe('Could not load the QR reader. Check the connection and try again, or type the code.');
  });
});
