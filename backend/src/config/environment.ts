import { plainToInstance, Transform } from 'class-transformer';
import {
  IsIn,
  IsInt,
  IsIP,
  IsOptional,
  IsString,
  IsUrl,
  Max,
  MaxLength,
  Min,
  MinLength,
  Validate,
  ValidationArguments,
  validateSync,
  ValidatorConstraint,
  ValidatorConstraintInterface,
} from 'class-validator';
import { parseTrustProxy } from './trust-proxy';

export const NODE_ENVS = ['development', 'production', 'test'] as const;
export type NodeEnv = (typeof NODE_ENVS)[number];

const toInt = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' && /^-?\d+$/.test(value.trim()) ? Number(value) : value;

@ValidatorConstraint({ name: 'trustProxy' })
class TrustProxyFormat implements ValidatorConstraintInterface {
  validate(value: unknown): boolean {
    return parseTrustProxy(String(value)).ok;
  }

  defaultMessage(args: ValidationArguments): string {
    const parsed = parseTrustProxy(String(args.value));
    return parsed.ok ? '' : parsed.problem;
  }
}

/** Every environment variable Gyre reads, validated once at boot. */
export class EnvironmentVariables {
  @IsOptional()
  @IsIn(NODE_ENVS)
  NODE_ENV?: NodeEnv;

  @IsOptional()
  @Transform(toInt)
  @IsInt()
  @Min(0)
  @Max(65535)
  PORT?: number;

  @IsOptional()
  @IsIP()
  HOST?: string;

  @IsOptional()
  @IsString()
  @MinLength(1)
  DATA_DIR?: string;

  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(512)
  JWT_SECRET?: string;

  @IsOptional()
  @IsUrl({ protocols: ['smtp', 'smtps'], require_tld: false, require_protocol: true })
  SMTP_URL?: string;

  @IsOptional()
  @IsUrl({ protocols: ['http', 'https'], require_tld: false, require_protocol: true })
  PUBLIC_URL?: string;

  @IsOptional()
  @Transform(toInt)
  @IsInt()
  @Min(1024)
  UPLOAD_MAX_BYTES?: number;

  /** Bulk upload: most manifest rows in one request. */
  @IsOptional()
  @Transform(toInt)
  @IsInt()
  @Min(1)
  BULK_UPLOAD_MAX_ROWS?: number;

  /** Bulk upload: most bytes of all files of one request together. */
  @IsOptional()
  @Transform(toInt)
  @IsInt()
  @Min(1024)
  BULK_UPLOAD_MAX_BYTES?: number;

  @IsOptional()
  @IsIn(['error', 'warn', 'log', 'debug', 'verbose'])
  LOG_LEVEL?: string;

  /** The reverse proxies whose X-Forwarded-For is believed; unset: none (see trust-proxy.ts). */
  @IsOptional()
  @IsString()
  @Validate(TrustProxyFormat)
  TRUST_PROXY?: string;

  /**
   * Set: computations go to BullMQ on this Redis and remote workers (`npm run worker`) compute
   * them; unset: the SQLite queue and the in-process worker threads (docs/scale-out.md).
   */
  @IsOptional()
  @IsUrl({ protocols: ['redis', 'rediss'], require_tld: false, require_protocol: true })
  REDIS_URL?: string;

  /** Computations handed to Redis and not yet finished, at most (with REDIS_URL). */
  @IsOptional()
  @Transform(toInt)
  @IsInt()
  @Min(1)
  @Max(10000)
  REMOTE_DISPATCH_LIMIT?: number;

  /** How often the server compares its running jobs with Redis's (with REDIS_URL), ms. */
  @IsOptional()
  @Transform(toInt)
  @IsInt()
  @Min(200)
  @Max(3_600_000)
  REMOTE_CHECK_INTERVAL_MS?: number;

  /** The largest analysis result a worker may post, in bytes. */
  @IsOptional()
  @Transform(toInt)
  @IsInt()
  @Min(1024)
  WORKER_RESULT_MAX_BYTES?: number;
}

/** Thrown when the environment is invalid: one line per bad variable, each naming it. */
export class EnvironmentError extends Error {
  constructor(readonly problems: string[]) {
    super(`Invalid environment:\n${problems.map((p) => `  - ${p}`).join('\n')}`);
    this.name = 'EnvironmentError';
  }
}

/** Validates the raw environment; the result carries only Gyre's variables, typed. */
export function validateEnvironment(raw: Record<string, unknown>): EnvironmentVariables {
  const known = Object.keys(new EnvironmentVariablesKeys());
  const picked: Record<string, unknown> = {};
  for (const key of known) {
    const value = raw[key];
    if (value !== undefined && value !== '') picked[key] = value;
  }
  const env = plainToInstance(EnvironmentVariables, picked);
  const errors = validateSync(env, { whitelist: true });
  if (errors.length > 0) {
    throw new EnvironmentError(
      errors.map((error) => {
        const reasons = Object.values(error.constraints ?? {}).join('; ');
        return `${error.property}=${JSON.stringify(picked[error.property])}: ${reasons}`;
      }),
    );
  }
  return env;
}

/** The names of the variables, for picking them out of process.env. */
class EnvironmentVariablesKeys implements Record<keyof EnvironmentVariables, undefined> {
  NODE_ENV = undefined;
  PORT = undefined;
  HOST = undefined;
  DATA_DIR = undefined;
  JWT_SECRET = undefined;
  SMTP_URL = undefined;
  PUBLIC_URL = undefined;
  UPLOAD_MAX_BYTES = undefined;
  BULK_UPLOAD_MAX_ROWS = undefined;
  BULK_UPLOAD_MAX_BYTES = undefined;
  LOG_LEVEL = undefined;
  TRUST_PROXY = undefined;
  REDIS_URL = undefined;
  REMOTE_DISPATCH_LIMIT = undefined;
  REMOTE_CHECK_INTERVAL_MS = undefined;
  WORKER_RESULT_MAX_BYTES = undefined;
}
