import { Cellar } from '../entities/cellar.entity';
import { Membership } from '../entities/membership.entity';
import { User } from '../entities/user.entity';
import { CreateAccounts1796170000000 } from './migrations/1796170000000-CreateAccounts';

/** Every entity, listed by hand (glob paths do not work under Vitest). */
export const entities = [User, Cellar, Membership];

/** Every migration, oldest first. Add a new one at the end. */
export const migrations = [CreateAccounts1796170000000];
