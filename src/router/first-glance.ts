import { FIRST_GLANCE_ELEMENT_ID } from '@shared/first-glance-script';

/**
 * Takes away a scanned label's first glance (shared/first-glance-script.ts), drawn over the page
 * before the app started; called once the app's first page is rendered, so the next paint shows it.
 */
export function removeFirstGlance(): void {
  document.getElementById(FIRST_GLANCE_ELEMENT_ID)?.remove();
}
