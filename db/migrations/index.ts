import { Foundation1764633600000 } from './1764633600000-foundation';

/** Every migration in order. Add new ones at the end (see DEVELOPERS.md, "Migrations"). */
export const migrations = [Foundation1764633600000];
