import type { DataSource } from 'typeorm';

/**
 * Fixed-window counters in PostgreSQL, so every server instance shares them.
 * `hit` counts one more request for `key` and returns the count in the current window.
 */
export class RateLimiter {
  constructor(private readonly ds: DataSource) {}

  async hit(key: string, windowSeconds: number): Promise<number> {
    const rows: { hits: number }[] = await this.ds.query(
      `INSERT INTO rate_limit (key, window_start, hits) VALUES ($1, now(), 1)
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limit.window_start < now() - make_interval(secs => $2) THEN 1 ELSE rate_limit.hits + 1 END,
         window_start = CASE WHEN rate_limit.window_start < now() - make_interval(secs => $2) THEN now() ELSE rate_limit.window_start END
       RETURNING hits`,
      [key, windowSeconds],
    );
    return rows[0]!.hits;
  }

  /** The count in the current window without adding to it. */
  async count(key: string, windowSeconds: number): Promise<number> {
    const rows: { hits: number }[] = await this.ds.query(
      `SELECT hits FROM rate_limit WHERE key = $1 AND window_start >= now() - make_interval(secs => $2)`,
      [key, windowSeconds],
    );
    return rows[0]?.hits ?? 0;
  }

  async clear(key: string): Promise<void> {
    await this.ds.query(`DELETE FROM rate_limit WHERE key = $1`, [key]);
  }
}
