import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Public bottle cards: when a Keeper turns them on, a bottle or case label opens a small
 * public card (batch, bottling date, ABV estimate, sulfite line, note) for anyone.
 * Off by default: nothing of a cellar is public unless its Keeper says so.
 */
export class AddBottleCards1796170200000 implements MigrationInterface {
  name = 'AddBottleCards1796170200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE cellars ADD COLUMN public_bottle_cards boolean NOT NULL DEFAULT false`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE cellars DROP COLUMN public_bottle_cards`);
  }
}
