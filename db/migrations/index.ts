import { Foundation1764633600000 } from './1764633600000-foundation';
import { Rounds1764637200000 } from './1764637200000-rounds';

/** Every migration in order. Add new ones at the end (see DEVELOPERS.md, "Migrations"). */
export const migrations = [Foundation1764633600000, Rounds1764637200000];
