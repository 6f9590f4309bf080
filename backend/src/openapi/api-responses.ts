import { applyDecorators, HttpStatus } from '@nestjs/common';
import {
  ApiResponse,
  type OpenAPIObject,
  type ReferenceObject,
  type SchemaObject,
} from '@nestjs/swagger';
import generated from './shared-schemas.generated.json';

/** The name of one of the shared API types (shared-schemas.generated.json, by the compiler). */
export type SharedSchemaName = keyof typeof generated.schemas;

interface ResponseOptions {
  description: string;
  /** A `Page<T>` of the type (items, total, page, pageSize). */
  page?: boolean;
  /** A plain array of the type. */
  array?: boolean;
  /** The body may be `null` (e.g. nothing computed yet). */
  nullable?: boolean;
  status?: HttpStatus.OK | HttpStatus.CREATED;
}

function reference(name: SharedSchemaName): ReferenceObject {
  return { $ref: `#/components/schemas/${name}` };
}

function bodySchema(name: SharedSchemaName, options: ResponseOptions): SchemaObject {
  if (options.page) {
    return {
      type: 'object',
      required: ['items', 'total', 'page', 'pageSize'],
      properties: {
        items: { type: 'array', items: reference(name) },
        total: { type: 'integer' },
        page: { type: 'integer' },
        pageSize: { type: 'integer' },
      },
    };
  }
  if (options.array) return { type: 'array', items: reference(name) };
  return { allOf: [reference(name)], nullable: options.nullable === true };
}

/**
 * Documents a route's success body as one of the shared API types, by its name in
 * `@gyre/shared` (checked by the compiler against the generated schemas).
 */
export function ApiResult(name: SharedSchemaName, options: ResponseOptions): MethodDecorator {
  return applyDecorators(
    ApiResponse({
      status: options.status ?? HttpStatus.OK,
      description: options.description,
      schema: bodySchema(name, options),
    }),
  );
}

/** Documents a route that answers a file or a stream (CSV, ZIP, PDF, EDF, events) as bytes. */
export function ApiFile(mediaType: string, description: string): MethodDecorator {
  return applyDecorators(
    ApiResponse({
      status: HttpStatus.OK,
      description,
      content: { [mediaType]: { schema: { type: 'string', format: 'binary' } } },
    }),
  );
}

/** Adds the shared API types to the document's components, where `ApiResult` points. */
export function withSharedSchemas(document: OpenAPIObject): OpenAPIObject {
  document.components = {
    ...document.components,
    schemas: {
      ...(generated.schemas as Record<SharedSchemaName, SchemaObject>),
      ...document.components?.schemas,
    },
  };
  return document;
}
