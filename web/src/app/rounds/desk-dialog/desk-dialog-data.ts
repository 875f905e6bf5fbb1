import type { Observable } from 'rxjs';
import type {
  DispatchInput,
  ExtensionGrant,
  StudyDecision,
  TransitionRequest,
  Withdrawal,
} from '@ringlet/shared/contracts/rounds';
import { ROUND_STATE_LABELS, type RoundState } from '@ringlet/shared/contracts/round-states';

interface DeskDialogBase {
  readonly title: string;
  readonly intro?: string;
}

/** A desk dialog of one kind whose `send` performs the call with that kind's parsed value. */
interface SendsValue<K extends string, V, R> extends DeskDialogBase {
  readonly kind: K;
  readonly send: (value: V) => Observable<R>;
}

/** A round moving to another state; `send` gets the parsed transition request. */
export interface TransitionDialogData<R> extends SendsValue<'transition', TransitionRequest, R> {
  readonly to: RoundState;
  /** Whether the move may close early (before results are due). */
  readonly offerForce: boolean;
  readonly reasonRequired: boolean;
  /** The button text (docs/GLOSSARY.md names moves back for what they do). */
  readonly moveLabel?: string;
  /** Who hears of the move. */
  readonly whoIsTold?: string;
}
export type WithdrawalDialogData<R> = SendsValue<'withdrawal', Withdrawal, R>;
export type ExtensionDialogData<R> = SendsValue<'extension', ExtensionGrant, R>;
export interface DispatchDialogData<R> extends SendsValue<'dispatch', DispatchInput, R> {
  /** Packing and transport cautions (shared/contracts/safety.ts). */
  readonly cautions: readonly string[];
}
export type DecisionDialogData<R> = SendsValue<'decision', StudyDecision, R>;
export interface ConfirmDialogData<R> extends DeskDialogBase {
  readonly kind: 'confirm';
  /** The button's label (e.g. "Remove item C"). */
  readonly confirmLabel: string;
  readonly send: () => Observable<R>;
}

/** What a desk dialog asks for, one shape per kind; `send` performs the call with the parsed value. */
export type DeskDialogData<R> =
  | TransitionDialogData<R>
  | WithdrawalDialogData<R>
  | ExtensionDialogData<R>
  | DispatchDialogData<R>
  | DecisionDialogData<R>
  | ConfirmDialogData<R>;

export type DeskDialogKind = DeskDialogData<unknown>['kind'];

/** The submit button's text. */
export function deskConfirmLabel(data: DeskDialogData<unknown>): string {
  if (data.kind === 'transition') return data.moveLabel ?? `Move to ${ROUND_STATE_LABELS[data.to]}`;
  if (data.kind === 'confirm') return data.confirmLabel;
  return 'Confirm';
}

/** Which fields the dialog shows for its kind. */
export function deskFields(data: DeskDialogData<unknown>) {
  return {
    dispatch: data.kind === 'dispatch',
    extension: data.kind === 'extension',
    decision: data.kind === 'decision',
    reason: data.kind !== 'dispatch' && data.kind !== 'confirm',
    reasonOptional: data.kind === 'transition' && !data.reasonRequired,
    force: data.kind === 'transition' && data.offerForce,
  };
}
