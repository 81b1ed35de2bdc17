import crypto from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { CODE_ALPHABET, CODE_LENGTH } from '../../shared/schemas/vessels';

/** A random label code: 8 symbols of 32 = 40 bits, from crypto's generator. */
export function randomLabelCode(): string {
  const bytes = crypto.randomBytes(CODE_LENGTH);
  let code = '';
  for (const byte of bytes) code += CODE_ALPHABET[byte % CODE_ALPHABET.length]; // 256 % 32 = 0: no bias
  return code;
}

/**
 * A code used by no vessel, lot or case, so a scan resolves to exactly one thing.
 * Collisions are astronomically rare; the loop is there for correctness, not speed.
 */
export async function newLabelCode(tx: EntityManager): Promise<string> {
  for (;;) {
    const code = randomLabelCode();
    const [row] = await tx.query(
      `SELECT EXISTS (SELECT 1 FROM vessels WHERE code = $1)
           OR EXISTS (SELECT 1 FROM bottle_lots WHERE code = $1)
           OR EXISTS (SELECT 1 FROM bottle_cases WHERE code = $1) AS taken`,
      [code],
    );
    if (!row.taken) return code;
  }
}
