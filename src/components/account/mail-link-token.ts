import type { LocationQuery } from 'vue-router';
import { mailTokenSchema } from '@shared/schemas/accounts';

/** The token of a mailed link (`?token=…`), or null when it is missing or cut short. */
export function tokenFromQuery(query: LocationQuery): string | null {
  const raw = query.token;
  const parsed = mailTokenSchema.safeParse(typeof raw === 'string' ? raw : '');
  return parsed.success ? parsed.data : null;
}
