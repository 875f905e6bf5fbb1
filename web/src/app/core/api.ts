import { HttpContextToken } from '@angular/common/http';

/** Base path of every API call (same origin; the dev server proxies it). */
export const API = '/api/v1';

/**
 * HTTP statuses the caller shows itself (e.g. a form's 400 field errors or the sign-in page's
 * 401). The error interceptor neither redirects nor shows a snackbar for them.
 */
export const HANDLED_STATUSES = new HttpContextToken<readonly number[]>(() => []);
