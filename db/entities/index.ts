import { AuditEvent } from './audit-event';
import { MailMessage } from './mail-message';
import { Membership } from './membership';
import { Organisation } from './organisation';
import { PasswordToken } from './password-token';
import { User } from './user';

export { AuditEvent, MailMessage, Membership, Organisation, PasswordToken, User };

/** Every entity, registered with the DataSource. */
export const entities = [Organisation, User, Membership, PasswordToken, AuditEvent, MailMessage];
