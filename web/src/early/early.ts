// The early script's entry (see early-calls.ts): a classic script, no Angular, a few hundred bytes.
import { EARLY_GLOBAL, startEarlyCalls } from './early-calls';

(window as unknown as Record<string, unknown>)[EARLY_GLOBAL] = startEarlyCalls(
  location.pathname,
  (input, init) => fetch(input, init),
);
