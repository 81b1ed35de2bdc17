import type { DataSource, EntityManager } from 'typeorm';
import type { Role } from '../../shared/roles';
import { hashPassword } from '../accounts/passwords';
import { memberActor } from '../core/actor';
import { Cellar } from '../entities/cellar.entity';
import { Membership } from '../entities/membership.entity';
import { User } from '../entities/user.entity';
import { seedDemoRecords } from './demo-cellar';
import { DEMO_DEVICE_TOKEN, seedDemoDevice } from './demo-device';
import { seedDemoTasks } from './demo-tasks';

/** Shared by every demo account; printed at start-up. Demo only. */
export const DEMO_PASSWORD = 'demo-cellar-2026';

/** Invented people on the reserved .test domain. */
export const DEMO_PEOPLE = {
  keeper: { email: 'maren@fernhollow.test', displayName: 'Maren Holt' },
  hand: { email: 'tobias@fernhollow.test', displayName: 'Tobias Vey' },
  guest: { email: 'ilse@fernhollow.test', displayName: 'Ilse Marrow' },
  clubKeeper: { email: 'oskar@brackenford.test', displayName: 'Oskar Lind' },
} as const;

async function addUser(tx: EntityManager, person: { email: string; displayName: string }, hash: string) {
  return tx.getRepository(User).save(tx.getRepository(User).create({ ...person, passwordHash: hash }));
}

async function addMember(tx: EntityManager, cellar: Cellar, user: User, role: Role) {
  await tx.getRepository(Membership).save(tx.getRepository(Membership).create({ cellarId: cellar.id, userId: user.id, role }));
}

/**
 * Seeds the demo household and a club cellar when the database has no users yet.
 * @returns true when it seeded
 */
export async function seedDemoIfEmpty(ds: DataSource): Promise<boolean> {
  if ((await ds.getRepository(User).count()) > 0) return false;
  const hash = await hashPassword(DEMO_PASSWORD);
  await ds.transaction(async (tx) => {
    const maren = await addUser(tx, DEMO_PEOPLE.keeper, hash);
    const tobias = await addUser(tx, DEMO_PEOPLE.hand, hash);
    const ilse = await addUser(tx, DEMO_PEOPLE.guest, hash);
    const oskar = await addUser(tx, DEMO_PEOPLE.clubKeeper, hash);

    const cellars = tx.getRepository(Cellar);
    const home = await cellars.save(
      cellars.create({
        name: 'Fernhollow cellar',
        unitSystem: 'metric',
        timeZone: 'Europe/Berlin',
        sanitisedValidDays: 7,
        headspaceWarnPercent: 5,
        annualLimitL: null,
      }),
    );
    await addMember(tx, home, maren, 'keeper');
    await addMember(tx, home, tobias, 'hand');
    await addMember(tx, home, ilse, 'guest');
    const homePeople = { keeper: memberActor(home.id, maren.id, 'keeper'), hand: memberActor(home.id, tobias.id, 'hand') };
    await seedDemoRecords(tx, homePeople);
    await seedDemoTasks(tx, homePeople);
    await seedDemoDevice(tx, homePeople.keeper);

    const club = await cellars.save(
      cellars.create({
        name: 'Brackenford Mead Circle',
        unitSystem: 'us',
        timeZone: 'America/Chicago',
        sanitisedValidDays: 5,
        headspaceWarnPercent: 4,
        annualLimitL: 757.08,
      }),
    );
    await addMember(tx, club, oskar, 'keeper');
    await addMember(tx, club, maren, 'hand');
  });
  return true;
}

/** Tells the demo sign-ins, one per role. */
export function printDemoSignIns(justSeeded: boolean): void {
  console.log(justSeeded ? 'Seeded the demo cellar. Demo sign-ins:' : 'Demo sign-ins (if the demo data is still there):');
  for (const [role, person] of [
    ['Keeper', DEMO_PEOPLE.keeper],
    ['Hand  ', DEMO_PEOPLE.hand],
    ['Guest ', DEMO_PEOPLE.guest],
  ] as const) {
    console.log(`  ${role}  ${person.email}  password: ${DEMO_PASSWORD}`);
  }
  console.log(`  Demo hydrometer token (README, "Digital hydrometers"): ${DEMO_DEVICE_TOKEN}`);
}
