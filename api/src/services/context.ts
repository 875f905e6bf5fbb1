import type { DataSource } from 'typeorm';
import type { AppConfig } from '../config';
import type { JobQueue } from '../jobs/queue';
import type { Mailer } from '../mail/mailer';

/** What every service needs; built once in createApp(). */
export interface AppContext {
  ds: DataSource;
  config: AppConfig;
  mailer: Mailer;
  log: (msg: string, err?: unknown) => void;
  /** The PostgreSQL-backed job queue (api/src/jobs); absent when the app runs without one (most tests). */
  queue?: JobQueue;
}
