import { applyDecorators } from '@nestjs/common';
import { ApiPropertyOptional, type ApiPropertyOptions } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, IsUUID, Max, MaxLength, Min } from 'class-validator';

/*
 * The optional query parameters the list routes share, each one decorator: the OpenAPI
 * property and its class-validator checks together.
 */

type FilterDocs = Pick<ApiPropertyOptions, 'description' | 'example'>;

/** One of `values`: a state, a kind, or the column to sort by (`default` documents the choice). */
export function OneOf(
  values: readonly string[],
  docs: FilterDocs & { default?: string } = {},
): PropertyDecorator {
  return applyDecorators(
    ApiPropertyOptional({ ...docs, enum: values }),
    IsOptional(),
    IsIn(values),
  );
}

/**
 * A row id to filter by, taken as text: a malformed or unknown id matches nothing (the
 * pipeline's lists: recordings, flags, reports, revisions, the audit trail).
 */
export function IdText(docs: FilterDocs = {}): PropertyDecorator {
  return applyDecorators(ApiPropertyOptional(docs), IsOptional(), IsString(), MaxLength(64));
}

/** A row id to filter by that must be a UUID (the study model's lists): else a 400. */
export function IdUuid(docs: FilterDocs = {}): PropertyDecorator {
  return applyDecorators(ApiPropertyOptional(docs), IsOptional(), IsUUID());
}

/** `?q=`: part of a code, name or e-mail, at most `maxLength` characters. */
export function SearchText(description: string, maxLength = 100): PropertyDecorator {
  return applyDecorators(
    ApiPropertyOptional({ description }),
    IsOptional(),
    IsString(),
    MaxLength(maxLength),
  );
}

/** A whole number from `minimum` to `maximum` (`?page=`, `?limit=`; `default` documents it). */
export function WholeNumber(bounds: {
  minimum: number;
  maximum: number;
  default: number;
}): PropertyDecorator {
  return applyDecorators(
    ApiPropertyOptional(bounds),
    IsOptional(),
    Type(() => Number),
    IsInt(),
    Min(bounds.minimum),
    Max(bounds.maximum),
  );
}
