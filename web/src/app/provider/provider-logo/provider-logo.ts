import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { ProviderProfile } from '@ringlet/shared/contracts/provider';
import type { Observable } from 'rxjs';
import { API } from '../../core/api';
import { FileDrop } from '../../core/file-drop';
import { fieldIssuesOf, problemMessage } from '../../core/problem';
import { ProviderService } from '../provider-service';
import { LOGO_MAX_KB, base64OfDataUrl, logoAddress, logoSizeRefusal } from './logo-file';

/** The PT provider's logo: shows the current one, takes a new PNG or JPEG, or removes it. */
@Component({
  selector: 'app-provider-logo',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, FileDrop],
  templateUrl: './provider-logo.html',
  styleUrl: './provider-logo.scss',
})
export class ProviderLogo {
  private readonly service = inject(ProviderService);
  readonly profile = input.required<ProviderProfile | null>();
  /** The profile after the logo changed. */
  readonly changed = output<ProviderProfile>();
  protected readonly maxKb = LOGO_MAX_KB;
  protected readonly busy = signal(false);
  protected readonly logoFailure = signal<string | null>(null);
  protected readonly logoUrl = computed(() => logoAddress(API, this.profile()?.updatedAt ?? null));

  protected pickLogo(file: File): void {
    this.logoFailure.set(logoSizeRefusal(file.size));
    if (this.logoFailure()) return;
    const reader = new FileReader();
    reader.onload = () => this.send(this.service.setLogo(base64OfDataUrl(reader.result)));
    reader.readAsDataURL(file);
  }

  protected removeLogo(): void {
    this.send(this.service.removeLogo());
  }

  private send(call: Observable<ProviderProfile>): void {
    this.busy.set(true);
    call.subscribe({
      next: (p) => {
        this.busy.set(false);
        this.changed.emit(p);
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.logoFailure.set(fieldIssuesOf(e)[0]?.message ?? problemMessage(e));
      },
    });
  }
}
