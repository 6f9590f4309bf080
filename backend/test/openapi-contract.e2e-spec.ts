import request from 'supertest';
import generated from '../src/openapi/shared-schemas.generated.json';
import { useTestApp } from './helpers/test-app';

interface MediaType {
  schema?: Record<string, unknown>;
}
interface ResponseObject {
  description?: string;
  content?: Record<string, MediaType>;
}
interface Operation {
  requestBody?: unknown;
  responses: Record<string, ResponseObject>;
}
interface OpenApiDocument {
  paths: Record<string, Record<string, Operation>>;
  components: { schemas: Record<string, unknown> };
}

const METHODS = new Set(['get', 'post', 'put', 'patch', 'delete']);

/** True when a schema says something about the body's shape (not `{}` or a bare object). */
function describesShape(schema: Record<string, unknown> | undefined): boolean {
  if (schema === undefined) return false;
  if ('$ref' in schema || 'allOf' in schema || 'oneOf' in schema || 'anyOf' in schema) return true;
  if (schema.type === 'array') return describesShape(schema.items as Record<string, unknown>);
  if (schema.type === 'object') return 'properties' in schema;
  // Files and text bodies (CSV, ZIP, PDF, EDF) are strings or binary.
  return typeof schema.type === 'string';
}

function referencesIn(node: unknown, found: Set<string>): Set<string> {
  if (Array.isArray(node)) node.forEach((item) => referencesIn(item, found));
  else if (node !== null && typeof node === 'object') {
    for (const [key, value] of Object.entries(node)) {
      if (key === '$ref' && typeof value === 'string') found.add(value);
      else referencesIn(value, found);
    }
  }
  return found;
}

// OpenAPI 3.0.3, "Responses Object": each response describes its body through `content`, and
// a `$ref` must resolve inside the document ("Reference Object").
describe('the OpenAPI description types every success body', () => {
  const t = useTestApp({ seed: false });
  let document: OpenApiDocument;
  beforeAll(async () => {
    const response = await request(t.url).get('/api/docs/openapi.json');
    expect(response.status).toBe(200);
    document = response.body as OpenApiDocument;
  });

  it('gives every 2xx response with a body a schema of its shape', () => {
    const untyped: string[] = [];
    let operations = 0;
    for (const [path, item] of Object.entries(document.paths)) {
      for (const [method, operation] of Object.entries(item)) {
        if (!METHODS.has(method)) continue;
        operations += 1;
        const successes = Object.entries(operation.responses).filter(([status]) =>
          /^2\d\d$/.test(status),
        );
        if (successes.length === 0)
          untyped.push(`${method.toUpperCase()} ${path}: no 2xx response`);
        for (const [status, response] of successes) {
          // 202 and 204 answer without a body (e.g. a password-reset request).
          if (status === '202' || status === '204') continue;
          const media = Object.entries(response.content ?? {});
          if (media.length === 0 || !media.every(([, body]) => describesShape(body.schema))) {
            untyped.push(`${method.toUpperCase()} ${path} ${status}`);
          }
        }
      }
    }
    expect(operations).toBeGreaterThan(60);
    expect(untyped).toEqual([]);
  });

  it('types every JSON success body with the generated shared API types, never a class of its own', () => {
    const bodies = Object.values(document.paths).flatMap((item) =>
      Object.entries(item)
        .filter(([method]) => METHODS.has(method))
        .flatMap(([, operation]) =>
          Object.entries(operation.responses)
            .filter(([status]) => /^2\d\d$/.test(status))
            .map(([, response]) => response.content?.['application/json']?.schema)
            .filter((schema) => schema !== undefined),
        ),
    );
    expect(bodies.length).toBeGreaterThan(50);
    const names = [...referencesIn(bodies, new Set<string>())].map((reference) =>
      reference.replace('#/components/schemas/', ''),
    );
    const generatedNames = new Set(Object.keys(generated.schemas));
    expect(names.filter((name) => !generatedNames.has(name))).toEqual([]);
    // Every other schema of the document is a request body's class or one it nests.
    const requestBodies = Object.values(document.paths).flatMap((item) =>
      Object.values(item).map((operation) => operation.requestBody),
    );
    const reached = new Set<string>();
    let pending = [...referencesIn(requestBodies, new Set<string>())];
    while (pending.length > 0) {
      const name = pending.pop()!.replace('#/components/schemas/', '');
      if (reached.has(name)) continue;
      reached.add(name);
      pending = [...pending, ...referencesIn(document.components.schemas[name], new Set())];
    }
    const strays = Object.keys(document.components.schemas).filter(
      (name) => !generatedNames.has(name) && !reached.has(name),
    );
    expect(strays).toEqual([]);
  });

  it('resolves every $ref to a schema of the document', () => {
    const references = [...referencesIn(document, new Set<string>())];
    expect(references.length).toBeGreaterThan(50);
    const unresolved = references.filter((reference) => {
      const name = reference.replace('#/components/schemas/', '');
      return (
        !reference.startsWith('#/components/schemas/') || !(name in document.components.schemas)
      );
    });
    expect(unresolved).toEqual([]);
  });

  it('documents shared API types with their fields, e.g. the results of a recording', () => {
    const results = document.components.schemas.RecordingResultsView as {
      properties: Record<string, unknown>;
    };
    expect(Object.keys(results.properties)).toEqual(
      expect.arrayContaining(['run', 'source', 'channels', 'task', 'rest', 'quality']),
    );
  });
});
