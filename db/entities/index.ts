import { AuditEvent } from './audit-event';
import { MailMessage } from './mail-message';
import { Membership } from './membership';
import { Organisation } from './organisation';
import { PasswordToken } from './password-token';
import {
  Enrolment,
  Invitation,
  Measurand,
  Round,
  RoundTransition,
  Scheme,
  Shipment,
  Submission,
  SubmissionVersion,
  TestItem,
} from './round';
import { User } from './user';
import { Attachment, InstrumentCheck } from './lab-bench';
import { HomogeneityStudy, ReminderLog } from './round-desk';
import { AssessorGrant, Evaluation, EvaluationResult, Investigation } from './evaluation';
import { Report } from './report';
import { ProviderProfile } from './provider-profile';
import { PrecisionExclusion, PrecisionReference } from './precision';

export { AuditEvent, MailMessage, Membership, Organisation, PasswordToken, User };
export {
  Enrolment,
  Invitation,
  Measurand,
  Round,
  RoundTransition,
  Scheme,
  Shipment,
  Submission,
  SubmissionVersion,
  TestItem,
};
export { HomogeneityStudy, ReminderLog };
export { Attachment, InstrumentCheck };
export { AssessorGrant, Evaluation, EvaluationResult, Investigation };
export { Report };
export { ProviderProfile };
export { PrecisionExclusion, PrecisionReference };

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
];
