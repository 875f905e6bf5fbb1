import { DOCUMENT } from '@angular/common';
import {
  ApplicationRef,
  type ApplicationConfig,
  ErrorHandler,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { provideHttpClient, withFetch, withInterceptors } from '@angular/common/http';
import {
  NavigationCancel,
  NavigationEnd,
  NavigationError,
  Router,
  provideRouter,
  withComponentInputBinding,
} from '@angular/router';
import { filter, take } from 'rxjs';
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
import { dropEarlyResponses, earlyResponseInterceptor } from './core/early-responses';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    // The error interceptor is outermost, so it sees a request only after the CSRF retry; the
    // answers the early script already has (web/src/early) are taken innermost, in place of a
    // second request.
    provideHttpClient(
      withFetch(),
      withInterceptors([errorInterceptor, csrfInterceptor, earlyResponseInterceptor]),
    ),
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
      // The early answers are for the first page only: once it has opened and asked for its
      // data, drop what it did not take (and in any case after 30 s).
      const appRef = inject(ApplicationRef);
      inject(Router)
        .events.pipe(
          filter(
            (e) =>
              e instanceof NavigationEnd ||
              e instanceof NavigationCancel ||
              e instanceof NavigationError,
          ),
          take(1),
        )
        .subscribe(() => void appRef.whenStable().then(dropEarlyResponses));
      setTimeout(dropEarlyResponses, 30_000);
    }),
  ],
};
