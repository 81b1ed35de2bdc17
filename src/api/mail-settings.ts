import { mailSettingsSchema, type MailSettings } from '@shared/schemas/mail-settings';
import { request, cellarPath } from './http';

/** The signed-in member's own e-mail reminders in a cellar. */
export const fetchMyMailSettings = (cellarId: string): Promise<MailSettings> =>
  request('GET', cellarPath(cellarId, 'mail-settings'), mailSettingsSchema);

export const saveMyMailSettings = (cellarId: string, settings: MailSettings): Promise<MailSettings> =>
  request('PUT', cellarPath(cellarId, 'mail-settings'), mailSettingsSchema, settings);
