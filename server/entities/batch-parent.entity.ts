import { Column, Entity, PrimaryColumn } from 'typeorm';
import { numericTransformer } from './numeric';

/** Parentage of a split or blend, with how much of each parent went in. */
@Entity({ name: 'batch_parents' })
export class BatchParent {
  @PrimaryColumn({ name: 'child_id', type: 'uuid' })
  childId: string;

  @PrimaryColumn({ name: 'parent_id', type: 'uuid' })
  parentId: string;

  @Column({ name: 'volume_l', type: 'numeric', precision: 10, scale: 3, transformer: numericTransformer })
  volumeL: number;
}
