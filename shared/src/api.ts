/** The body of every error the API answers with. */
export interface ErrorBody {
  statusCode: number;
  /** A stable code clients can switch on, e.g. `VALIDATION_FAILED`, `RECORDING_DUPLICATE`. */
  code: string;
  message: string;
  details: Record<string, unknown> | null;
}

/**
 * One thing wrong with a request's body, query or route parameters: `field` is its path
 * (`email`, `items.0.name`, `visitId`), `reason` the message naming what was expected.
 * A `VALIDATION_FAILED` answer carries them as `details.problems`.
 */
export interface ValidationProblem {
  field: string;
  reason: string;
}

/** `GET /api/health`. */
export interface HealthReport {
  status: 'ok' | 'degraded' | 'down';
  version: string;
  database: { reachable: boolean; error?: string };
  migrations: { applied: number; expected: number; pending: boolean };
}

/** One page of a list endpoint. */
export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}
