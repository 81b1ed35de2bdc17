import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A photo on a journal entry. Kept in PostgreSQL (bytea) so a database backup holds the
 * whole cellar record and nothing can drift between disk and table.
 */
@Entity({ name: 'photos' })
export class Photo {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ name: 'batch_id', type: 'uuid' })
  batchId: string;

  @Column({ name: 'mime_type', type: 'varchar', length: 16 })
  mimeType: 'image/jpeg' | 'image/png' | 'image/webp';

  @Column({ name: 'byte_size', type: 'integer' })
  byteSize: number;

  @Column({ type: 'bytea', select: false })
  data: Buffer;

  @Column({ type: 'bytea', select: false })
  thumbnail: Buffer;

  /** At most DISPLAY_MAX_PX on the long side; null for photos stored before display copies. */
  @Column({ type: 'bytea', select: false, nullable: true })
  display: Buffer | null;

  @Column({ name: 'uploaded_by', type: 'uuid', nullable: true })
  uploadedBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
