import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type { FormControl } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { PrecisionSigmaSources } from '@ringlet/shared/contracts/precision';
import type { SigmaPtRuleInput } from '@ringlet/shared/contracts/rounds';
import { RoundsService } from './rounds-service';

/** One level (item × measurand) of a finished precision study whose s_R can serve as σ_R. */
export interface SigmaSourceChoice {
  readonly roundId: string;
  readonly roundCode: string;
  readonly measurandKey: string;
  readonly sR: number;
  readonly sr: number | null;
  /** study code · level · measurand · s_R */
  readonly label: string;
}

const short = (v: number) => String(Number(v.toPrecision(4)));

/**
 * Every level with a positive s_R; only those of `measurandKey` when the scheme's studies have
 * that measurand, else all of them (the coordinator may map another file code).
 */
export function sigmaSourceChoices(
  sources: PrecisionSigmaSources,
  measurandKey: string,
): SigmaSourceChoice[] {
  const all = sources.studies.flatMap((s) =>
    s.measurands.flatMap((m) =>
      m.levels
        .filter((l) => l.sR !== null && l.sR > 0)
        .map((l) => ({
          roundId: s.roundId,
          roundCode: s.roundCode,
          measurandKey: m.key,
          sR: l.sR as number,
          sr: l.sr,
          label: `${s.roundCode} · ${l.itemLabel || l.itemCode} · ${m.label} · s_R ${short(l.sR as number)} ${m.unit}`,
        })),
    ),
  );
  const key = measurandKey.trim();
  const same = all.filter((c) => c.measurandKey === key);
  return same.length > 0 ? same : all;
}

/**
 * The precision rule beyond the dialog's form fields: σ_r, the replicate count m and the study
 * link. Taking a study fills σ_R; editing σ_R by hand afterwards drops the link (σ_r and m stay,
 * as before). Call in an injection context (a component field initialiser).
 */
export function sigmaStudyLink(sigmaR: FormControl<number | null>, initial?: SigmaPtRuleInput) {
  const rule = signal<SigmaPtRuleInput | undefined>(initial);
  sigmaR.valueChanges.pipe(takeUntilDestroyed()).subscribe((v) => {
    const r = rule();
    if (r?.kind === 'precision' && r.study && Number(v) !== r.sigmaR) {
      rule.set({ ...r, study: undefined });
    }
  });
  return {
    /** The rule to hand to sigmaRuleFromForm as `previous`. */
    rule: rule.asReadonly(),
    study: computed(() => {
      const r = rule();
      return r?.kind === 'precision' ? r.study : undefined;
    }),
    /** Fill σ_R (and σ_r with m = the replicates required, when 1–20) from a study's level. */
    take(c: SigmaSourceChoice, replicates: number | null): void {
      const m = Number(replicates);
      const fits = Number.isInteger(m) && m >= 1 && m <= 20;
      rule.set({
        kind: 'precision',
        sigmaR: c.sR,
        ...(c.sr !== null && c.sr > 0
          ? { sigmaRepeatability: c.sr, ...(fits ? { replicates: m } : {}) }
          : {}),
        study: { roundId: c.roundId, roundCode: c.roundCode },
      });
      sigmaR.setValue(c.sR);
      sigmaR.markAsDirty();
    },
  };
}

/** "Take from a precision study": a select of the scheme's finished studies' s_R per level. */
@Component({
  selector: 'app-sigma-source-picker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatFormFieldModule, MatSelectModule],
  template: `
    @if (choices(); as list) {
      @if (list.length === 0) {
        <p class="none">No finished precision study in this scheme gives s_R yet.</p>
      } @else {
        <mat-form-field>
          <mat-label>Take from a precision study</mat-label>
          <mat-select data-testid="sigma-source" (selectionChange)="picked.emit($event.value)">
            @for (c of list; track $index) {
              <mat-option [value]="c">{{ c.label }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
      }
    }
  `,
  styles: `
    :host {
      display: block;
      flex: 1 1 100%;
    }
    mat-form-field {
      width: 100%;
    }
    .none {
      margin: 0 0 12px;
      color: #5b6675;
    }
  `,
})
export class SigmaSourcePicker {
  private readonly api = inject(RoundsService);
  readonly schemeId = input.required<string>();
  /** The dialog's file code: the list keeps that measurand's levels when there are any. */
  readonly measurandKey = input('');
  readonly picked = output<SigmaSourceChoice>();
  private readonly sources = signal<PrecisionSigmaSources | null>(null);
  protected readonly choices = computed(() => {
    const s = this.sources();
    return s ? sigmaSourceChoices(s, this.measurandKey()) : null;
  });

  constructor() {
    effect(() => {
      this.api.precisionSources(this.schemeId()).subscribe((s) => this.sources.set(s));
    });
  }
}
