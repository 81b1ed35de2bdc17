import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A display copy of each photo (at most 2,560 px on its long side) beside the original and
 * the thumbnail, so a phone opening a photo never downloads a camera's full frame. Photos
 * stored before this have none; they are served from the original until re-uploaded.
 */
export class AddPhotoDisplayCopy1796170520000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE photos ADD COLUMN display bytea`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE photos DROP COLUMN display`);
  }
}
