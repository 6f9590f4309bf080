import { applyDecorators } from '@nestjs/common';
import { ApiProperty, ApiPropertyOptional, type ApiPropertyOptions } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsNotEmpty, IsOptional, IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { CALENDAR_DATE_PATTERN, STUDY_CODE_PATTERN } from '@gyre/shared';

/*
 * The validated text fields that bodies of several modules share, each one decorator: the
 * OpenAPI property and its class-validator checks together (as query-filters.ts for queries).
 */

type FieldDocs = Pick<ApiPropertyOptions, 'description' | 'example'>;

/** The longest name of a person, study or site. */
const NAME_MAX_LENGTH = 200;

/** The longest reason kept in the audit trail. */
const REASON_MAX_LENGTH = 2000;
/** The shortest reason a judgement (a flag, a blinded decision) takes. */
const WRITTEN_REASON_MIN_LENGTH = 10;

/** Leading and trailing white space removed before validation (a string; anything else as sent). */
export function Trimmed(): PropertyDecorator {
  return Transform(({ value }: { value: unknown }) =>
    typeof value === 'string' ? value.trim() : value,
  );
}

/** An optional reason for a change, kept in the audit trail: at most 2,000 characters. */
export function AuditReasonText(
  docs: FieldDocs = { description: 'Why; kept in the audit trail' },
): PropertyDecorator {
  return applyDecorators(
    ApiPropertyOptional(docs),
    IsOptional(),
    IsString(),
    MaxLength(REASON_MAX_LENGTH),
  );
}

/**
 * A written reason, trimmed, of 10 to 2,000 characters (raising or clearing a flag, a blinded
 * decision). `optional`: a body may leave it out.
 */
export function WrittenReasonText(
  docs: FieldDocs & { optional?: boolean } = {},
): PropertyDecorator {
  const { optional, ...documented } = docs;
  const checks = [
    Trimmed(),
    IsString(),
    MinLength(WRITTEN_REASON_MIN_LENGTH),
    MaxLength(REASON_MAX_LENGTH),
  ];
  const property = { minLength: WRITTEN_REASON_MIN_LENGTH, ...documented };
  return optional === true
    ? applyDecorators(ApiPropertyOptional(property), IsOptional(), ...checks)
    : applyDecorators(ApiProperty(property), ...checks);
}

/** A name (of a person, study or site): not empty, at most 200 characters. */
export function NameText(docs: FieldDocs = {}): PropertyDecorator {
  return applyDecorators(ApiProperty(docs), IsString(), IsNotEmpty(), MaxLength(NAME_MAX_LENGTH));
}

/** A name a body may leave out (the one stored stays); when given, as `NameText`. */
export function OptionalNameText(docs: FieldDocs = {}): PropertyDecorator {
  return applyDecorators(
    ApiPropertyOptional(docs),
    IsOptional(),
    IsString(),
    IsNotEmpty(),
    MaxLength(NAME_MAX_LENGTH),
  );
}

/** A study's or site's code (`STUDY_CODE_PATTERN`); a refusal shows `example`. */
export function StudyCodeText(example: string): PropertyDecorator {
  return applyDecorators(
    ApiProperty({ example, pattern: STUDY_CODE_PATTERN.source }),
    Matches(STUDY_CODE_PATTERN, {
      message: `code must be 2–32 upper-case letters, digits or inner hyphens, e.g. ${example}`,
    }),
  );
}

/**
 * A calendar day written `YYYY-MM-DD` (whether the day exists is the service's check); a
 * refusal names the field. `optional`: a body or query may leave it out.
 */
export function CalendarDateText(docs: FieldDocs & { optional?: boolean } = {}): PropertyDecorator {
  const { optional, ...documented } = docs;
  const pattern = Matches(CALENDAR_DATE_PATTERN, {
    message: '$property must be a calendar date written YYYY-MM-DD',
  });
  return optional === true
    ? applyDecorators(ApiPropertyOptional(documented), IsOptional(), pattern)
    : applyDecorators(ApiProperty(documented), pattern);
}
