/**
 * The look of Ringlet (docs/QUALITY.md "Look") and of each signal, defined once: the palette,
 * and per signal its colour, shape and words. Reports (reports/text.ts), the charts
 * (./board-charts.ts) and the web's signal badge read it; web/src/styles.scss states the same
 * colours as theme tokens (`--rl-signal-*`), and web/src/theme.spec.ts fails when they differ.
 * The limits behind the signals are in shared/stats/scores.ts (`SIGNAL_LIMITS`, `signalFor`).
 */
import { SIGNAL_LIMITS, type Signal } from '../stats/scores';

export type { Signal } from '../stats/scores';

/** Our palette. */
export const PALETTE = {
  ink: '#1f3a5f',
  teal: '#1b7f79',
  saffron: '#b7791f',
  carmine: '#a4262c',
  grey: '#5b6470',
  rule: '#c9cfd6',
} as const;

export interface SignalLook {
  /** Its colour (never shown alone: shape and word go with it). */
  readonly colour: string;
  /** Its shape, an ECharts symbol name and the web badge's SVG. */
  readonly shape: 'circle' | 'triangle' | 'diamond';
  /** The badge word, e.g. "Warning". */
  readonly word: string;
  /** The words in a sentence, e.g. "warning signal" (docs/GLOSSARY.md). */
  readonly words: string;
}

/** Each signal has its own colour, shape and word: never colour alone. */
export const SIGNAL_LOOKS: Readonly<Record<Signal, SignalLook>> = {
  acceptable: { colour: PALETTE.teal, shape: 'circle', word: 'Acceptable', words: 'acceptable' },
  warning: { colour: PALETTE.saffron, shape: 'triangle', word: 'Warning', words: 'warning signal' },
  action: { colour: PALETTE.carmine, shape: 'diamond', word: 'Action', words: 'action signal' },
};

const pick = <K extends keyof SignalLook>(k: K): Record<Signal, SignalLook[K]> => ({
  acceptable: SIGNAL_LOOKS.acceptable[k],
  warning: SIGNAL_LOOKS.warning[k],
  action: SIGNAL_LOOKS.action[k],
});

export const SIGNAL_COLOURS: Readonly<Record<Signal, string>> = pick('colour');
export const SIGNAL_SHAPES: Readonly<Record<Signal, SignalLook['shape']>> = pick('shape');
/** Words for a signal in a sentence (docs/GLOSSARY.md). */
export const SIGNAL_WORDS: Readonly<Record<Signal, string>> = pick('words');

const { warning: W, action: A, en: E } = SIGNAL_LIMITS;
/** The signal rule in one sentence, from the limits of shared/stats/scores.ts. */
export const SIGNAL_RULE_TEXT =
  `|score| ≤ ${W} ${SIGNAL_WORDS.acceptable}, ${W} < |score| < ${A} ${SIGNAL_WORDS.warning}, ` +
  `|score| ≥ ${A} ${SIGNAL_WORDS.action}; |En| ≤ ${E} ${SIGNAL_WORDS.acceptable}, > ${E} ${SIGNAL_WORDS.action}`;

export interface LimitLine {
  /** Where the line sits on the score axis. */
  readonly value: number;
  /** Its label, e.g. "+3" or "−2" (true minus sign). */
  readonly label: string;
  /** The signal that starts beyond it. */
  readonly signal: 'warning' | 'action';
  readonly colour: string;
}

const signed = (v: number): string => (v < 0 ? `−${-v}` : `+${v}`);
const line = (value: number, signal: 'warning' | 'action'): LimitLine => ({
  value,
  label: signed(value),
  signal,
  colour: SIGNAL_COLOURS[signal],
});

/** The warning and action limits on a score axis, top to bottom: +3, +2, −2, −3. */
export const SCORE_LIMIT_LINES: readonly LimitLine[] = [
  line(A, 'action'),
  line(W, 'warning'),
  line(-W, 'warning'),
  line(-A, 'action'),
];
