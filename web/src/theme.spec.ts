import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PALETTE, SIGNAL_LOOKS } from '@ringlet/shared/charts/signals';

/**
 * The web theme states the palette as Sass variables and CSS custom properties (styles.scss); the
 * one list is PALETTE / SIGNAL_LOOKS in shared/charts/signals.ts, which the reports and charts use.
 * This fails when the two disagree.
 */
describe('theme tokens match the shared palette', () => {
  const scss = readFileSync(join(__dirname, 'styles.scss'), 'utf8');
  const sassVar = (name: string): string | undefined =>
    new RegExp(`^\\$${name}:\\s*(#[0-9a-fA-F]{6});`, 'm').exec(scss)?.[1]?.toLowerCase();
  const token = (name: string): string | undefined =>
    new RegExp(`--rl-${name}:\\s*#\\{\\$([a-z-]+)\\};`).exec(scss)?.[1];

  it('has each palette colour as a Sass variable of the same value', () => {
    const names: Record<keyof typeof PALETTE, string> = {
      ink: 'ink-blue',
      teal: 'teal',
      saffron: 'saffron',
      carmine: 'carmine',
      grey: 'grey',
      rule: 'rule',
    };
    for (const [key, name] of Object.entries(names)) {
      expect([key, sassVar(name)]).toEqual([key, PALETTE[key as keyof typeof PALETTE]]);
    }
  });

  it('gives each signal the colour of SIGNAL_LOOKS as --rl-signal-<signal>', () => {
    for (const [signal, look] of Object.entries(SIGNAL_LOOKS)) {
      const variable = token(`signal-${signal}`);
      expect(variable).toBeDefined();
      expect([signal, sassVar(variable!)]).toEqual([signal, look.colour]);
    }
  });
});
