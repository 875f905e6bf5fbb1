import { Column, CreateDateColumn, UpdateDateColumn } from 'typeorm';

/**
 * Column kinds many entities share, named once. They map exactly as the plain TypeORM decorators
 * they stand for (db/entities.spec.ts checks every column against the migrations).
 */

/** A uuid column (mostly a reference to another row's id), named in snake_case. */
export const UuidColumn = (name: string, options: { nullable?: boolean; unique?: boolean } = {}) =>
  Column({ type: 'uuid', name, ...options });

/** When the row was made: timestamptz set on insert. */
export const CreatedAtColumn = (name = 'created_at') =>
  CreateDateColumn({ type: 'timestamptz', name });

/** When the row last changed: timestamptz set on every update. */
export const UpdatedAtColumn = () => UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' });
