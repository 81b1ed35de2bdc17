import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';

// The photo reader is html5-qrcode, replaced here by a stand-in whose answer each test sets:
// what is checked is how the component tells a read code, an unreadable photo and a reader
// that never loaded apart. Each test loads the component afresh after choosing what loading html5-qrcode gives.
const reader = { answer: async (): Promise<string> => '' };
const standIn = () => ({
  Html5Qrcode: class {
    scanFile = () => reader.answer();
    clear = () => undefined;
  },
});

beforeEach(() => {
  vi.resetModules();
  vi.doMock('html5-qrcode', standIn);
});
afterEach(() => {
  document.body.innerHTML = '';
  vi.doUnmock('html5-qrcode');
});

async function pickPhoto() {
  const { default: PhotoDecode } = await import('@/components/scan/PhotoDecode.vue');
  const wrapper = mount(PhotoDecode, { attachTo: document.body, global: { plugins: [Quasar] } });
  const input = wrapper.find<HTMLInputElement>('[data-test=photo-file]');
  Object.defineProperty(input.element, 'files', { value: [new File(['png'], 'label.png', { type: 'image/png' })] });
  await input.trigger('change');
  await flushPromises();
  await flushPromises();
  return { wrapper, error: () => wrapper.find('[data-test=photo-error]') };
}

describe('reading a label from a photo', () => {
  it('hands on the text of the code it read, with no message', async () => {
    reader.answer = async () => 'https://cellar.example.test/s/K7M2P9QX';
    const { wrapper, error } = await pickPhoto();
    expect(wrapper.emitted('decoded')).toEqual([['https://cellar.example.test/s/K7M2P9QX']]);
    expect(error().exists()).toBe(false);
  });

  it('asks for a better photo when no code is found in it', async () => {
    reader.answer = async () => {
      throw new Error('No MultiFormat Readers were able to detect the code.');
    };
    const { wrapper, error } = await pickPhoto();
    expect(wrapper.emitted('decoded')).toBeUndefined();
    expect(error().text()).toContain('No QR code found in that photo');
  });

  it('says the reader could not be loaded, not that the photo is bad, when its code never arrives', async () => {
    vi.doMock('html5-qrcode', () => {
      throw new TypeError('Failed to fetch dynamically imported module');
    });
    const { wrapper, error } = await pickPhoto();
    expect(wrapper.emitted('decoded')).toBeUndefined();
    expect(error().text()).toBe('Could not load the QR reader. Check the connection and try again, or type the code.');
  });
});
