/**
 * How often the audit chain is anchored. Read from the environment here (not AppConfig) so the
 * audit module owns its two settings; the defaults need no configuration.
 */
export interface AnchorSettings {
  /** A checkpoint once this many entries were appended since the last one. */
  everyEntries: number;
  /** A checkpoint at least this often (seconds) while entries keep being appended. */
  everySeconds: number;
}

export const DEFAULT_ANCHOR_SETTINGS: AnchorSettings = { everyEntries: 100, everySeconds: 60 };

const LIMITS = {
  AUDIT_ANCHOR_EVERY_ENTRIES: { min: 1, max: 1_000_000 },
  AUDIT_ANCHOR_EVERY_SECONDS: { min: 1, max: 86_400 },
} as const;

/** Reads `AUDIT_ANCHOR_EVERY_ENTRIES` and `AUDIT_ANCHOR_EVERY_SECONDS`; a bad value stops start-up. */
export function anchorSettingsFrom(env: Record<string, string | undefined>): AnchorSettings {
  return {
    everyEntries: integerSetting(
      env,
      'AUDIT_ANCHOR_EVERY_ENTRIES',
      DEFAULT_ANCHOR_SETTINGS.everyEntries,
    ),
    everySeconds: integerSetting(
      env,
      'AUDIT_ANCHOR_EVERY_SECONDS',
      DEFAULT_ANCHOR_SETTINGS.everySeconds,
    ),
  };
}

function integerSetting(
  env: Record<string, string | undefined>,
  name: keyof typeof LIMITS,
  fallback: number,
): number {
  const raw = env[name];
  if (raw === undefined || raw.trim() === '') return fallback;
  const { min, max } = LIMITS[name];
  const value = Number(raw.trim());
  if (!/^\d+$/.test(raw.trim()) || value < min || value > max) {
    throw new Error(`${name}: "${raw}" found, a whole number from ${min} to ${max} expected`);
  }
  return value;
}
