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
import { routes } from './app-routes';
import { AppErrorHandler } from './core/app-error-handler';
import { HealthService } from './core/health-service';
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
    }),
  ],
};
