import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsEmail, IsNotEmpty, IsOptional, IsString, MaxLength } from 'class-validator';
import { PASSWORD_MIN_LENGTH } from '@gyre/shared';

export class SignInDto {
  @ApiProperty({ example: 'analyst@example.org' })
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @ApiProperty({ format: 'password' })
  @IsString()
  @IsNotEmpty()
  @MaxLength(256)
  password: string;
}

export class ChangePasswordDto {
  @ApiProperty({ format: 'password' })
  @IsString()
  @IsNotEmpty()
  @MaxLength(256)
  currentPassword: string;

  @ApiProperty({ format: 'password', minLength: PASSWORD_MIN_LENGTH })
  @IsString()
  @MaxLength(256)
  newPassword: string;
}

export class PasswordResetRequestDto {
  @ApiProperty()
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;
}

export class PasswordResetConfirmDto {
  @ApiProperty({ description: 'The token from the e-mailed link' })
  @IsString()
  @IsNotEmpty()
  @MaxLength(200)
  token: string;

  @ApiProperty({ format: 'password', minLength: PASSWORD_MIN_LENGTH })
  @IsString()
  @MaxLength(256)
  newPassword: string;
}

export class AcceptInvitationDto {
  @ApiProperty({ description: 'The token from the invitation e-mail' })
  @IsString()
  @IsNotEmpty()
  @MaxLength(200)
  token: string;

  @ApiProperty({ format: 'password', minLength: PASSWORD_MIN_LENGTH })
  @IsString()
  @MaxLength(256)
  password: string;

  @ApiPropertyOptional({ description: 'Replaces the name the admin entered' })
  @IsOptional()
  @IsString()
  @IsNotEmpty()
  @MaxLength(200)
  name?: string;
}
