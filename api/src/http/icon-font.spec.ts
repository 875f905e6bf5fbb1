/**
 * The web app ships a cut-down icon font (scripts/icons.mjs): it must draw every icon web/src
 * uses, or a user would see a ligature name ("leaderboard") instead of the icon. The check shapes
 * each used name with HarfBuzz and wants one glyph back.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = join(__dirname, '..', '..', '..');
const check = (...args: string[]) =>
  spawnSync(process.execPath, [join(root, 'scripts', 'icons.mjs'), '--check', ...args], {
    cwd: root,
    encoding: 'utf8',
  });

describe('the shipped icon font', () => {
  it('draws every icon web/src uses', () => {
    const r = check();
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/has all \d+ icons used/);
  });

  it('is small: only the icons used, not the 4 MB package font', () => {
    const bytes = statSync(
      join(root, 'web', 'src', 'fonts', 'material-symbols-outlined-subset.woff2'),
    ).size;
    expect(bytes).toBeLessThan(50 * 1024);
  });

  it('names an icon a template uses that the font lacks', () => {
    const dir = mkdtempSync(join(tmpdir(), 'ringlet-icons-'));
    try {
      mkdirSync(join(dir, 'app'));
      // "pets" is a Material Symbol that Ringlet does not use.
      writeFileSync(
        join(dir, 'app', 'page.html'),
        '<mat-icon>logout</mat-icon><mat-icon>pets</mat-icon>',
      );
      const r = check('--web', dir);
      expect(r.status).toBe(1);
      expect(r.stderr).toContain('icon "pets"');
      expect(r.stderr).not.toContain('icon "logout"');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
