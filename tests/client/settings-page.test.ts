import { describe, expect, it } from 'vitest';
import SettingsPage from '@/pages/SettingsPage.vue';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

const settingsPath = `/c/${CELLAR_ID}/settings`;
const jumps = () => [...document.querySelectorAll<HTMLAnchorElement>('[data-test=settings-jump] a')];

describe('Settings page', () => {
  it('opens with a jump to each section the Keeper sees, each to the section’s own anchor', async () => {
    signIn(fakeApi(), 'keeper');
    const { wrapper } = await mountInApp(SettingsPage, settingsPath);
    expect(jumps().map((a) => a.textContent?.trim())).toEqual([
      'Cellar',
      'Members',
      'My e-mail reminders',
      'Mail',
      'Records as files',
      'Archive',
      'Plans',
      'Hydrometers',
    ]);
    for (const a of jumps()) {
      const id = a.getAttribute('href')!.split('#')[1]!;
      expect(a.getAttribute('href')).toBe(`${settingsPath}#${id}`);
      expect(document.getElementById(id)?.tagName).toBe('SECTION');
    }
    expect(wrapper.find('#plans [data-test=plans-panel]').exists()).toBe(true);
    wrapper.unmount();
  });

  it('offers a Hand only the sections a Hand has', async () => {
    signIn(fakeApi(), 'hand');
    const { wrapper } = await mountInApp(SettingsPage, settingsPath);
    expect(jumps().map((a) => a.textContent?.trim())).toEqual(['Cellar', 'Members', 'My e-mail reminders', 'Records as files']);
    expect(document.getElementById('plans')).toBeNull();
    wrapper.unmount();
  });

  it('scrolls an address with a section to that section, below the fixed header, and any other page to its top', async () => {
    signIn(fakeApi(), 'keeper');
    const { router } = await mountInApp(SettingsPage, settingsPath);
    const scroll = router.options.scrollBehavior!;
    const page = router.currentRoute.value;
    await router.push({ path: settingsPath, hash: '#plans' });
    const section = router.currentRoute.value;
    expect(await scroll(section, page, null)).toEqual({ el: '#plans', top: 56 });
    expect(await scroll(page, section, null)).toEqual({ top: 0 });
  });
});
