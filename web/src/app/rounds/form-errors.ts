/** Moved to shared/form-errors.ts; precision/ still imports it from here. */
export { parseWith, pathMap, showServerError, type PathMap } from '../shared/form-errors';
