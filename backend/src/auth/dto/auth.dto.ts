import { applyDecorators } from '@nestjs/common';
import { ApiProperty } from '@nestjs/swagger';
import { IsEmail, IsNotEmpty, IsString, MaxLength } from 'class-validator';
import { PASSWORD_MIN_LENGTH } from '@gyre/shared';
import { OptionalNameText } from '../../common/dto/text-fields';

/** An e-mail address (RFC 5321 limits a path to 254 characters). */
const EmailAddress = (example?: string): PropertyDecorator =>
  applyDecorators(
    ApiProperty({ example }),
    IsEmail({}, { message: 'email must be an e-mail address' }),
    MaxLength(254),
  );

/** A password the caller already has. */
const Password = (): PropertyDecorator =>
  applyDecorators(ApiProperty({ format: 'password' }), IsString(), IsNotEmpty(), MaxLength(256));

/** A password to set; its length and byte limits are checked by auth/password-policy.ts. */
const NewPassword = (): PropertyDecorator =>
  applyDecorators(
    ApiProperty({ format: 'password', minLength: PASSWORD_MIN_LENGTH }),
    IsString(),
    MaxLength(256),
  );

/** The secret of an e-mailed link. */
const EmailedToken = (description: string): PropertyDecorator =>
  applyDecorators(ApiProperty({ description }), IsString(), IsNotEmpty(), MaxLength(200));

export class SignInDto {
  @EmailAddress('analyst@example.org') email: string;
  @Password() password: string;
}

export class ChangePasswordDto {
  @Password() currentPassword: string;
  @NewPassword() newPassword: string;
}

export class PasswordResetRequestDto {
  @EmailAddress() email: string;
}

export class PasswordResetConfirmDto {
  @EmailedToken('The token from the e-mailed link') token: string;
  @NewPassword() newPassword: string;
}

export class AcceptInvitationDto {
  @EmailedToken('The token from the invitation e-mail') token: string;
  @NewPassword() password: string;

  @OptionalNameText({ description: 'Replaces the name the admin entered' }) name?: string;
}
