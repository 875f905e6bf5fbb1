/** Round evaluation, Consensus board, score explanations and Track record run rules (pure). */
export * from './evaluate';
export * from './board';
export * from './explain';
export * from './run-rules';
export * from './precision-study';
