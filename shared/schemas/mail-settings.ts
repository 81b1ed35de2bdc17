import { z } from 'zod';
import { TASK_WHATS, taskWhatSchema } from './plans';

export const REMINDER_DELIVERIES = ['instant', 'digest', 'off'] as const;
export const reminderDeliverySchema = z.enum(REMINDER_DELIVERIES);

/** One member's e-mail reminders in one cellar. */
export const mailSettingsSchema = z.object({
  /** 'instant': a mail per task as it comes due; 'digest': one mail a day at `digestHour`; 'off'. */
  delivery: reminderDeliverySchema,
  /** Hour of the day in the cellar's time zone (0–23) for the digest. */
  digestHour: z.number().int('a whole hour').min(0, '0 to 23').max(23, '0 to 23'),
  /** The kinds of task to be told about. */
  kinds: z.array(taskWhatSchema).max(TASK_WHATS.length),
});
export type MailSettings = z.infer<typeof mailSettingsSchema>;
