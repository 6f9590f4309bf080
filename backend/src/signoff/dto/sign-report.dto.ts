import { ApiProperty } from '@nestjs/swagger';
import { IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { SIGNATURE_MEANING } from '@gyre/shared';
import type { SignReportRequest } from '@gyre/shared';

export class SignReportDto implements SignReportRequest {
  @ApiProperty({ description: "The signer's password, entered again", format: 'password' })
  @IsString()
  @MinLength(1)
  @MaxLength(200)
  password: string;

  @ApiProperty({ example: SIGNATURE_MEANING, description: 'The meaning of the signature' })
  @IsString()
  @MaxLength(200)
  meaning: string;

  @ApiProperty({ description: 'The draftFingerprint of the previewed draft (64 hex digits)' })
  @IsString()
  @Matches(/^[0-9a-f]{64}$/, { message: 'fingerprint must be 64 lowercase hex digits' })
  fingerprint: string;
}
