import { DOCUMENT } from '@angular/common';
import {
  type ApplicationConfig,
  ErrorHandler,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { provideHttpClient, withFetch, withInterceptors } from '@angular/common/http';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { MatIconRegistry } from '@angular/material/icon';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS } from '@angular/material/form-field';
import { opensSignedInArea, routes } from './app-routes';
import { AuthService } from './core/auth-service';
import { loadContracts } from './core/contracts';
import { AppErrorHandler } from './core/app-error-handler';
import { HealthService } from './core/health-service';
import { prefetchPage } from './core/page-prefetch';
import { csrfInterceptor } from './core/csrf-interceptor';
import { errorInterceptor } from './core/error-interceptor';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    // The error interceptor is outermost, so it sees a request only after the CSRF retry.
    provideHttpClient(withFetch(), withInterceptors([errorInterceptor, csrfInterceptor])),
    { provide: ErrorHandler, useClass: AppErrorHandler },
    {
      provide: MAT_FORM_FIELD_DEFAULT_OPTIONS,
      useValue: { appearance: 'outline', subscriptSizing: 'dynamic' },
    },
    provideAppInitializer(() => {
      // Icons come from the locally shipped Material Symbols font.
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined');
      // Ask the server's mode at once (a public answer), so it is on its way while the guards ask
      // who is signed in, instead of being asked after that answer.
      void inject(HealthService).ensureLoaded();
      // Every answer is parsed with the shared contracts (a lazy chunk): fetch them now.
      void loadContracts();
      // On a page behind sign-in, ask who is signed in now, while the router loads the page's
      // code, rather than once its guard runs (the guard then finds the answer on its way).
      const pathname = inject(DOCUMENT).location.pathname;
      if (opensSignedInArea(pathname))
        void inject(AuthService)
          .ensureLoaded()
          .catch(() => undefined);
      // And load the page's code now too: the router would wait for that answer first.
      void prefetchPage(routes, pathname);
    }),
  ],
};
