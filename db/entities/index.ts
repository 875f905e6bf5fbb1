// One entity per file, named after the domain. Import entities from this index (`db/entities`),
// never from their files. Each entity is named once, in ./all.ts.
import * as all from './all';

export * from './all';
export type { ReportKind } from './report';
export type { LabInvitationAnswer } from './lab-invitation';

/** Every entity, registered with the DataSource (the classes ./all.ts names). */
export const entities = Object.values(all);
