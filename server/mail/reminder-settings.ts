import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/roles';
import { TASK_WHATS, type TaskWhat } from '../../shared/schemas/plans';
import type { MailSettings } from '../../shared/schemas/mail-settings';

/**
 * A member without settings of their own: Keepers and Hands, who do the work, get a morning
 * digest of every kind of task; Guests get nothing unless they ask.
 */
export function defaultMailSettings(role: Role): MailSettings {
  return role === 'guest'
    ? { delivery: 'off', digestHour: 7, kinds: [...TASK_WHATS] }
    : { delivery: 'digest', digestHour: 7, kinds: [...TASK_WHATS] };
}

/** A member who gets reminder mail, with their settings. */
export interface ReminderRecipient {
  cellarId: string;
  cellarName: string;
  timeZone: string;
  userId: string;
  email: string;
  displayName: string;
  settings: MailSettings;
}

interface RecipientRow {
  cellar_id: string;
  cellar_name: string;
  time_zone: string;
  user_id: string;
  email: string;
  display_name: string;
  role: Role;
  delivery: MailSettings['delivery'] | null;
  digest_hour: number | null;
  kinds: TaskWhat[] | null;
}

/** Every member of every cellar whose settings (or role default) ask for reminders: one query. */
export async function reminderRecipients(tx: EntityManager): Promise<ReminderRecipient[]> {
  const rows: RecipientRow[] = await tx.query(
    `SELECT m.cellar_id, c.name AS cellar_name, c.time_zone, m.user_id, u.email, u.display_name, m.role,
            s.delivery, s.digest_hour, s.kinds
       FROM memberships m
       JOIN cellars c ON c.id = m.cellar_id
       JOIN users u ON u.id = m.user_id
       LEFT JOIN member_mail_settings s ON s.cellar_id = m.cellar_id AND s.user_id = m.user_id
      ORDER BY m.cellar_id, m.user_id`,
  );
  return rows
    .map((r) => ({
      cellarId: r.cellar_id,
      cellarName: r.cellar_name,
      timeZone: r.time_zone,
      userId: r.user_id,
      email: r.email,
      displayName: r.display_name,
      settings: r.delivery ? { delivery: r.delivery, digestHour: r.digest_hour!, kinds: r.kinds! } : defaultMailSettings(r.role),
    }))
    .filter((r) => r.settings.delivery !== 'off' && r.settings.kinds.length > 0);
}

/** One member's settings in one cellar (their own, or the role's default). */
export async function memberMailSettings(tx: EntityManager, cellarId: string, userId: string, role: Role): Promise<MailSettings> {
  const [row]: { delivery: MailSettings['delivery']; digest_hour: number; kinds: TaskWhat[] }[] = await tx.query(
    `SELECT delivery, digest_hour, kinds FROM member_mail_settings WHERE cellar_id = $1 AND user_id = $2`,
    [cellarId, userId],
  );
  return row ? { delivery: row.delivery, digestHour: row.digest_hour, kinds: row.kinds } : defaultMailSettings(role);
}

/** Stores one member's settings in one cellar. */
export async function saveMailSettings(tx: EntityManager, cellarId: string, userId: string, settings: MailSettings): Promise<void> {
  await tx.query(
    `INSERT INTO member_mail_settings (cellar_id, user_id, delivery, digest_hour, kinds) VALUES ($1, $2, $3, $4, $5)
     ON CONFLICT (cellar_id, user_id) DO UPDATE SET delivery = EXCLUDED.delivery, digest_hour = EXCLUDED.digest_hour,
       kinds = EXCLUDED.kinds, updated_at = now()`,
    [cellarId, userId, settings.delivery, settings.digestHour, settings.kinds],
  );
}
