import type { DataSource } from 'typeorm';
import type { AppConfig } from '../config';
import type { Mailer } from '../mail/mailer';

/** What every service needs; built once in createApp(). */
export interface AppContext {
  ds: DataSource;
  config: AppConfig;
  mailer: Mailer;
  log: (msg: string, err?: unknown) => void;
}
