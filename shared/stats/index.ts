/** Public API of Ringlet's statistics engine (pure TypeScript; see README.md in this folder). */
export * from './descriptive';
export * from './algorithm-a';
export * from './assigned-value';
export * from './sigma-pt';
export * from './scores';
export * from './homogeneity';
export * from './blunder-hints';
export * from './kde';
export * from './evaluate-round';
export * from './precision';
export * from './precision-fit';
export * from './precision-bias';
