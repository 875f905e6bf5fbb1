import { BreakpointObserver } from '@angular/cdk/layout';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  viewChild,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatListItem, MatListItemIcon, MatListItemTitle, MatNavList } from '@angular/material/list';
import { MatSidenav, MatSidenavContainer, MatSidenavContent } from '@angular/material/sidenav';
import { MatToolbar } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import { AuthService } from './core/auth-service';
import { HealthService } from './core/health-service';
import { LabChooser } from './core/lab-chooser';
import { navEntries } from './core/nav';

/**
 * The shell: toolbar, role-dependent navigation, and the routed page. It imports the Material
 * components it uses one by one, not their NgModules: MatListModule alone brought the selection
 * list and @angular/forms into the script every first visit loads (docs/TOOLCHAIN.md).
 */
@Component({
  selector: 'app-root',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatToolbar,
    MatSidenav,
    MatSidenavContainer,
    MatSidenavContent,
    MatNavList,
    MatListItem,
    MatListItemIcon,
    MatListItemTitle,
    MatButton,
    MatIconButton,
    MatIcon,
    LabChooser,
  ],
  templateUrl: './app.html',
  styleUrl: './app.scss',
})
export class App {
  private readonly auth = inject(AuthService);
  private readonly health = inject(HealthService);
  private readonly router = inject(Router);
  private readonly sidenav = viewChild(MatSidenav);

  protected readonly me = this.auth.me;
  protected readonly nav = computed(() => navEntries(this.auth.me(), this.health.hasOutbox()));
  protected readonly isNarrow = toSignal(
    inject(BreakpointObserver)
      .observe('(max-width: 959.98px)')
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );

  constructor() {
    effect(() => {
      if (this.auth.isSignedIn()) void this.health.ensureLoaded();
    });
  }

  /** On a tablet the navigation slides over the page; close it after choosing. */
  protected closeNavIfNarrow(): void {
    if (this.isNarrow()) void this.sidenav()?.close();
  }

  protected signOut(): void {
    this.auth.signOut().subscribe({
      complete: () => void this.router.navigate(['/sign-in']),
      error: () => void this.router.navigate(['/sign-in']),
    });
  }
}
