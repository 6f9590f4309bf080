import { AuditReasonText } from '../../common/dto/text-fields';

export class RerunDto {
  @AuditReasonText({ example: 'Settings v3: narrower band' }) reason?: string;
}
