import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsEmail, IsIn, IsOptional, IsUUID, MaxLength, ValidateIf } from 'class-validator';
import { ROLES, USER_STATES, type Role, type UserState } from '@gyre/shared';
import { IdUuid, OneOf, SearchText } from '../../common/dto/query-filters';
import { AuditReasonText, NameText, OptionalNameText } from '../../common/dto/text-fields';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

const lowerTrimmed = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim().toLowerCase() : value;

export class InviteUserDto {
  @ApiProperty({ example: 'new.analyst@example.org' })
  @Transform(lowerTrimmed)
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @NameText({ example: 'Dana Analyst' }) name: string;

  @ApiProperty({ enum: ROLES })
  @IsIn(ROLES)
  role: Role;

  @ApiPropertyOptional({ description: 'Required for every role but admin' })
  @IsOptional()
  @IsUUID()
  studyId?: string;

  @ApiPropertyOptional({ description: 'Required for technicians and coordinators' })
  @IsOptional()
  @IsUUID()
  siteId?: string;
}

export class UpdateUserDto {
  @OptionalNameText() name?: string;

  @ApiPropertyOptional({ enum: ROLES })
  @IsOptional()
  @IsIn(ROLES)
  role?: Role;

  @ApiPropertyOptional({ type: String, nullable: true })
  @IsOptional()
  @ValidateIf((_o, value) => value !== null)
  @IsUUID()
  studyId?: string | null;

  @ApiPropertyOptional({ type: String, nullable: true })
  @IsOptional()
  @ValidateIf((_o, value) => value !== null)
  @IsUUID()
  siteId?: string | null;

  @ApiPropertyOptional({
    enum: ['active', 'deactivated'],
    description: 'Deactivation ends every session',
  })
  @IsOptional()
  @IsIn(['active', 'deactivated'])
  state?: 'active' | 'deactivated';

  @AuditReasonText() reason?: string;
}

export const USER_SORT_FIELDS = ['email', 'name', 'role', 'createdAt', 'lastSignInAt'] as const;

export class UserQueryDto extends PageQueryDto {
  @OneOf(USER_SORT_FIELDS, { default: 'email' }) sort?: (typeof USER_SORT_FIELDS)[number];
  @OneOf(ROLES) role?: Role;
  @OneOf(USER_STATES) state?: UserState;
  @IdUuid() studyId?: string;
  @IdUuid() siteId?: string;
  @SearchText('Part of the name or e-mail') q?: string;
}
