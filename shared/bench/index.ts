/** Lab bench rules shared by the browser (live feedback) and the server (the record). */
export * from './instrument-check';
export * from './submission-checks';
