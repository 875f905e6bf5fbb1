/**
 * The shared zod contracts, loaded on first use rather than in the initial bundle: the shell
 * (toolbar, guards, interceptors) stays small, and the parse happens as soon as a response is in.
 * Feature pages, which are lazy anyway, import the contracts directly.
 *
 * Why: `import { z } from 'zod'` (as in shared/contracts) makes esbuild keep every zod locale
 * (~450 kB raw); see docs/TOOLCHAIN.md.
 */
let loading: Promise<typeof import('@ringlet/shared/contracts')> | null = null;

export function loadContracts(): Promise<typeof import('@ringlet/shared/contracts')> {
  loading ??= import('@ringlet/shared/contracts');
  return loading;
}
