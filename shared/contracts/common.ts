import * as z from 'zod';

/** Database ids are UUIDs. */
export const Id = z.uuid();
export type Id = z.infer<typeof Id>;

/** Route parameter `{id}`. */
export const IdParams = z.object({ id: Id });

/** ISO 8601 UTC timestamp on the wire. */
export const Timestamp = z.iso.datetime({ offset: true });

/** Problem-style error body used by every error response (see docs/ARCHITECTURE.md, "API conventions"). */
export const ProblemBody = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ProblemBody = z.infer<typeof ProblemBody>;

/** A PATCH body changes something: at least one of its fields is given. */
export const changesSomething = (patch: object): boolean =>
  Object.values(patch).some((v) => v !== undefined);
/** The message when it does not (with `.refine(changesSomething, changeSomething)`). */
export const changeSomething = { message: 'Change at least one field.' };

/** One field problem in a 400 response: `path` names the field. */
export const FieldIssue = z.object({ path: z.string(), message: z.string() });
export type FieldIssue = z.infer<typeof FieldIssue>;

export const Email = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'Enter a valid e-mail address.' }));

/** Passwords: long enough to matter, short enough for bcrypt's 72-byte limit. */
export const NewPassword = z
  .string()
  .min(12, { message: 'Use at least 12 characters.' })
  .max(72, { message: 'Use at most 72 characters.' });

export const HealthResponse = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.enum(['up', 'down']),
  version: z.string(),
  mode: z.enum(['demo', 'development', 'production', 'test']),
});
export type HealthResponse = z.infer<typeof HealthResponse>;
