import { createHash } from 'node:crypto';
import { EARLY_REQUESTS_SCRIPT } from '@shared/early-requests';

/** The CSP source that lets index.html run its inline early-requests script and no other. */
export const EARLY_REQUESTS_SCRIPT_HASH = `'sha256-${createHash('sha256').update(EARLY_REQUESTS_SCRIPT).digest('base64')}'`;
