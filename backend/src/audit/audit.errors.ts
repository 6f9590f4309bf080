export enum AuditError {
  BadTimeRange = 'AUDIT_BAD_TIME_RANGE',
}
