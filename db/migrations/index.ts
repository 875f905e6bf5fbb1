import { Foundation1764633600000 } from './1764633600000-foundation';
import { Rounds1764637200000 } from './1764637200000-rounds';
import { RoundDesk1764640800000 } from './1764640800000-round-desk';
import { LabBench1764644400000 } from './1764644400000-lab-bench';
import { Evaluation1764648000000 } from './1764648000000-evaluation';
import { Reports1764651600000 } from './1764651600000-reports';
import { LabInvitations1764900000201 } from './1764900000201-lab-invitations';
import { AppendOnlyResults1764900000400 } from './1764900000400-append-only-results';
import { ProviderProfile1764900000600 } from './1764900000600-provider-profile';
import { PrecisionStudies1765000000100 } from './1765000000100-precision-studies';

/** Every migration in order. Add new ones at the end (see DEVELOPERS.md, "Migrations"). */
export const migrations = [
  Foundation1764633600000,
  Rounds1764637200000,
  RoundDesk1764640800000,
  LabBench1764644400000,
  Evaluation1764648000000,
  Reports1764651600000,
  LabInvitations1764900000201,
  AppendOnlyResults1764900000400,
  ProviderProfile1764900000600,
  PrecisionStudies1765000000100,
];
