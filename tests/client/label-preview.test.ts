import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import LabelPreview from '@/components/labels/LabelPreview.vue';

const PDF_URL = '/api/cellars/c1/labels/pdf?template=a4-3x8-70x37&shelf=s1';

/** The server at the fetch boundary: a PDF with its label count, counting the requests. */
function pdfServer() {
  const fetchFake = vi.fn(
    async () => new Response(new Blob(['%PDF-1.7 test'], { type: 'application/pdf' }), { status: 200, headers: { 'x-label-count': '10' } }),
  );
  vi.stubGlobal('fetch', fetchFake);
  return fetchFake;
}

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
  document.body.innerHTML = '';
});

describe('label preview', () => {
  it('asks the server for the PDF once and shows that copy in the frame', async () => {
    const fetchFake = pdfServer();
    vi.spyOn(URL, 'createObjectURL').mockReturnValue('blob:preview-1');
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    const wrapper = mount(LabelPreview, {
      props: { url: PDF_URL, downloadUrl: `${PDF_URL}&download=true`, perPage: 24 },
      attachTo: document.body,
      global: { plugins: [Quasar] },
    });
    await flushPromises();
    expect(fetchFake).toHaveBeenCalledTimes(1);
    expect(wrapper.get('[data-test=preview-frame]').attributes('src')).toBe('blob:preview-1');
    expect(wrapper.get('[data-test=open-labels]').attributes('href')).toBe('blob:preview-1');
    expect(wrapper.get('[data-test=label-count]').text()).toBe('10 labels\u00a0· 1 sheet');
    // Still one request once everything has rendered: the frame never asks the server again.
    await flushPromises();
    expect(fetchFake).toHaveBeenCalledTimes(1);
  });

  it('lets go of the old copy when the selection changes and when it closes', async () => {
    pdfServer();
    vi.spyOn(URL, 'createObjectURL').mockReturnValueOnce('blob:first').mockReturnValueOnce('blob:second');
    const revoke = vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    const wrapper = mount(LabelPreview, { props: { url: PDF_URL, downloadUrl: null, perPage: 24 }, global: { plugins: [Quasar] } });
    await flushPromises();
    await wrapper.setProps({ url: `${PDF_URL}&skip=3` });
    await flushPromises();
    expect(revoke).toHaveBeenCalledWith('blob:first');
    wrapper.unmount();
    expect(revoke).toHaveBeenCalledWith('blob:second');
  });
});
