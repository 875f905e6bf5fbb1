// One entity per file, named after the domain. Import entities from this index (`db/entities`),
// never from their files.
import { Organisation } from './organisation';
import { User } from './user';
import { Membership } from './membership';
import { PasswordToken } from './password-token';
import { AuditEvent } from './audit-event';
import { MailMessage } from './mail-message';
import { Scheme } from './scheme';
import { Round } from './round';
import { RoundTransition } from './round-transition';
import { TestItem } from './test-item';
import { Measurand } from './measurand';
import { Enrolment } from './enrolment';
import { Invitation } from './invitation';
import { Shipment } from './shipment';
import { Submission } from './submission';
import { SubmissionVersion } from './submission-version';
import { HomogeneityStudy } from './homogeneity-study';
import { ReminderLog } from './reminder-log';
import { InstrumentCheck } from './instrument-check';
import { Attachment } from './attachment';
import { Evaluation } from './evaluation';
import { EvaluationResult } from './evaluation-result';
import { Investigation } from './investigation';
import { AssessorGrant } from './assessor-grant';
import { Report, type ReportKind } from './report';
import { ProviderProfile } from './provider-profile';
import { PrecisionReference } from './precision-reference';
import { PrecisionExclusion } from './precision-exclusion';
import { BillingDetails } from './billing-details';
import { BillingCounter } from './billing-counter';
import { Invoice } from './invoice';
import { CreditNote } from './credit-note';
import { PaymentEvent } from './payment-event';
import { RoundBilling } from './round-billing';
import { LabInvitation, type LabInvitationAnswer } from './lab-invitation';

export {
  Organisation,
  User,
  Membership,
  PasswordToken,
  AuditEvent,
  MailMessage,
  Scheme,
  Round,
  RoundTransition,
  TestItem,
  Measurand,
  Enrolment,
  Invitation,
  Shipment,
  Submission,
  SubmissionVersion,
  HomogeneityStudy,
  ReminderLog,
  InstrumentCheck,
  Attachment,
  Evaluation,
  EvaluationResult,
  Investigation,
  AssessorGrant,
  Report,
  ProviderProfile,
};
export { PrecisionExclusion, PrecisionReference };
export { BillingDetails, BillingCounter, Invoice, CreditNote, PaymentEvent, RoundBilling };
export { LabInvitation };
export type { ReportKind, LabInvitationAnswer };

/** Every entity, registered with the DataSource. Append new ones at the end. */
export const entities = [
  Organisation,
  User,
  Membership,
  PasswordToken,
  AuditEvent,
  MailMessage,
  Scheme,
  Round,
  RoundTransition,
  TestItem,
  Measurand,
  Enrolment,
  Invitation,
  Shipment,
  Submission,
  SubmissionVersion,
  HomogeneityStudy,
  ReminderLog,
  InstrumentCheck,
  Attachment,
  Evaluation,
  EvaluationResult,
  Investigation,
  AssessorGrant,
  Report,
  ProviderProfile,
  PrecisionReference,
  PrecisionExclusion,
  BillingDetails,
  BillingCounter,
  Invoice,
  CreditNote,
  PaymentEvent,
  RoundBilling,
  LabInvitation,
];
