import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  ROLES,
  USER_STATES,
  type MeResponse,
  type PackedRules,
  type Role,
  type SessionResponse,
  type UserState,
  type UserView,
} from '@gyre/shared';
import { SiteResponseDto, StudyResponseDto } from '../../studies/dto/study-responses.dto';

export class UserResponseDto implements UserView {
  @ApiProperty() id: string;
  @ApiProperty() email: string;
  @ApiProperty() name: string;
  @ApiProperty({ enum: ROLES }) role: Role;
  @ApiProperty({ type: String, nullable: true }) studyId: string | null;
  @ApiProperty({ type: String, nullable: true }) siteId: string | null;
  @ApiProperty({ enum: USER_STATES }) state: UserState;
  @ApiProperty({ type: String, nullable: true }) lastSignInAt: string | null;
  @ApiProperty() createdAt: string;
  @ApiProperty() updatedAt: string;
}

export class SessionResponseDto implements SessionResponse {
  @ApiProperty({ description: 'JWT (HS256), 15 minutes' }) accessToken: string;
  @ApiProperty({ enum: ['Bearer'] }) tokenType: 'Bearer';
  @ApiProperty({ example: 900 }) expiresInS: number;
  @ApiProperty({ type: UserResponseDto }) user: UserView;
}

export class MeResponseDto implements MeResponse {
  @ApiProperty({ type: UserResponseDto }) user: UserView;
  @ApiPropertyOptional({ type: StudyResponseDto, nullable: true }) study: StudyResponseDto | null;
  @ApiPropertyOptional({ type: SiteResponseDto, nullable: true }) site: SiteResponseDto | null;
  @ApiProperty({
    description: 'CASL rules in packRules form: unpack with abilityFromPackedRules',
    type: 'array',
    items: { type: 'array', items: {} },
  })
  rules: PackedRules;
}
