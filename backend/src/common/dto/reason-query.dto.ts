import { AuditReasonText } from './text-fields';

/** `?reason=` on DELETE routes: kept in the audit entry. */
export class ReasonQueryDto {
  @AuditReasonText() reason?: string;
}
