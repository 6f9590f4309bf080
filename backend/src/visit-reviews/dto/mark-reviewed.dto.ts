import { ApiProperty } from '@nestjs/swagger';
import { IsString, Matches } from 'class-validator';
import type { MarkVisitReviewed } from '@gyre/shared';

/** The fingerprint of the results the analyst saw (from `GET /api/visits/:visitId/review`). */
export class MarkReviewedDto implements MarkVisitReviewed {
  @ApiProperty({ pattern: '^[0-9a-f]{64}$', description: 'currentFingerprint of the review state' })
  @IsString()
  @Matches(/^[0-9a-f]{64}$/, { message: 'fingerprint must be 64 lower-case hex digits' })
  fingerprint: string;
}
