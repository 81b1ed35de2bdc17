import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, Unique } from 'typeorm';
import type { Role } from '../../shared/roles';
import { Cellar } from './cellar.entity';
import { User } from './user.entity';

/** A user's role in one cellar. */
@Entity({ name: 'memberships' })
@Unique('uq_memberships_cellar_user', ['cellarId', 'userId'])
export class Membership {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @ManyToOne(() => Cellar, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'cellar_id' })
  cellar: Cellar;

  @Column({ name: 'user_id', type: 'uuid' })
  userId: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: User;

  @Column({ type: 'varchar', length: 8 })
  role: Role;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
