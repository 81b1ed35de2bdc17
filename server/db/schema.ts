import { BatchParent } from '../entities/batch-parent.entity';
import { Batch } from '../entities/batch.entity';
import { BottleCaseRow } from '../entities/bottle-case.entity';
import { BottleDeparture } from '../entities/bottle-departure.entity';
import { BottleLotRow } from '../entities/bottle-lot.entity';
import { Cellar } from '../entities/cellar.entity';
import { Membership } from '../entities/membership.entity';
import { Photo } from '../entities/photo.entity';
import { Placement } from '../entities/placement.entity';
import { Rack } from '../entities/rack.entity';
import { Shelf } from '../entities/shelf.entity';
import { User } from '../entities/user.entity';
import { Vessel } from '../entities/vessel.entity';
import { JournalEntryRow } from '../journal/journal-entry.entity';
import { CreateAccounts1796170000000 } from './migrations/1796170000000-CreateAccounts';
import { CreateCellarRecords1796170100000 } from './migrations/1796170100000-CreateCellarRecords';
import { AddBottleCards1796170200000 } from './migrations/1796170200000-AddBottleCards';
import { CreatePlansAndTasks1796170300000 } from './migrations/1796170300000-CreatePlansAndTasks';
import { CreateMailOutbox1796170400000 } from './migrations/1796170400000-CreateMailOutbox';
import { CreateInvitationsAndPasswordResets1796170410000 } from './migrations/1796170410000-CreateInvitationsAndPasswordResets';
import { CreateMemberMailSettings1796170420000 } from './migrations/1796170420000-CreateMemberMailSettings';
import { AddSharedRateLimits1796170500000 } from './migrations/1796170500000-AddSharedRateLimits';
import { AddReadableDate1796170510000 } from './migrations/1796170510000-AddReadableDate';
import { AddPhotoDisplayCopy1796170520000 } from './migrations/1796170520000-AddPhotoDisplayCopy';
import { CreateAuditAndImportKeys1796170600000 } from './migrations/1796170600000-CreateAuditAndImportKeys';
import { UniqueVesselNames1796170700000 } from './migrations/1796170700000-UniqueVesselNames';
import { CreateDevices1796170800000 } from './migrations/1796170800000-CreateDevices';
import { CreateIdempotencyKeys1796170900000 } from './migrations/1796170900000-CreateIdempotencyKeys';
import { TastingScoresOnOwnScale1796171100000 } from './migrations/1796171100000-TastingScoresOnOwnScale';
import { ReadableDateWithoutSubtransaction1796171200000 } from './migrations/1796171200000-ReadableDateWithoutSubtransaction';
import { IndexAdditionsAndRemovals1796171300000 } from './migrations/1796171300000-IndexAdditionsAndRemovals';
import { AgeMilestoneTitles1796171400000 } from './migrations/1796171400000-AgeMilestoneTitles';
import { CreateTaskSnapshots1796171500000 } from './migrations/1796171500000-CreateTaskSnapshots';

/** Every entity, listed by hand (glob paths do not work under Vitest). */
export const entities = [
  User,
  Cellar,
  Membership,
  Rack,
  Shelf,
  Placement,
  Vessel,
  Batch,
  BatchParent,
  JournalEntryRow,
  Photo,
  BottleLotRow,
  BottleCaseRow,
  BottleDeparture,
];

/** Every migration, oldest first. Add a new one at the end. */
export const migrations = [
  CreateAccounts1796170000000,
  CreateCellarRecords1796170100000,
  AddBottleCards1796170200000,
  CreatePlansAndTasks1796170300000,
  CreateMailOutbox1796170400000,
  CreateInvitationsAndPasswordResets1796170410000,
  CreateMemberMailSettings1796170420000,
  AddSharedRateLimits1796170500000,
  AddReadableDate1796170510000,
  AddPhotoDisplayCopy1796170520000,
  CreateAuditAndImportKeys1796170600000,
  UniqueVesselNames1796170700000,
  CreateDevices1796170800000,
  CreateIdempotencyKeys1796170900000,
  TastingScoresOnOwnScale1796171100000,
  ReadableDateWithoutSubtransaction1796171200000,
  IndexAdditionsAndRemovals1796171300000,
  AgeMilestoneTitles1796171400000,
  CreateTaskSnapshots1796171500000,
];
