/**
 * The few API calls the crash test makes, with Node's own fetch (the built CLI has no
 * supertest). A request cut off by a kill ends in a network error, reported as status 0.
 */
import type { RecordingView } from '@gyre/shared';
import { CRASH_PASSWORD, CrashRole } from './crash-seed';

export interface ApiResponse<T = unknown> {
  /** HTTP status, or 0 when the connection broke (the server was killed). */
  status: number;
  body: T | null;
}

export class GyreClient {
  private tokens = new Map<CrashRole, string>();

  constructor(
    public url: string,
    private readonly emails: Record<CrashRole, string>,
  ) {}

  /** After a restart: a new address; tokens stay valid (same secret) but are taken afresh. */
  async connect(url: string): Promise<void> {
    this.url = url;
    this.tokens.clear();
    for (const role of Object.keys(this.emails) as CrashRole[]) {
      const response = await this.call<{ accessToken: string }>('POST', '/api/auth/sign-in', null, {
        json: { email: this.emails[role], password: CRASH_PASSWORD },
      });
      if (response.status !== 200 || response.body === null) {
        throw new Error(`sign-in of ${role}: HTTP ${response.status}`);
      }
      this.tokens.set(role, response.body.accessToken);
    }
  }

  async call<T>(
    method: 'GET' | 'POST',
    path: string,
    role: CrashRole | null,
    body: { json?: unknown; form?: FormData } = {},
  ): Promise<ApiResponse<T>> {
    const headers: Record<string, string> = {};
    if (role !== null) headers.Authorization = `Bearer ${this.tokens.get(role) ?? ''}`;
    let payload: string | FormData | undefined;
    if (body.json !== undefined) {
      headers['Content-Type'] = 'application/json';
      payload = JSON.stringify(body.json);
    } else if (body.form !== undefined) {
      payload = body.form;
    }
    try {
      const response = await fetch(`${this.url}${path}`, { method, headers, body: payload });
      const text = await response.text();
      let parsed: T | null = null;
      try {
        parsed = text.length > 0 ? (JSON.parse(text) as T) : null;
      } catch {
        parsed = null;
      }
      return { status: response.status, body: parsed };
    } catch {
      return { status: 0, body: null };
    }
  }

  upload(
    visitId: string,
    input: {
      kind: string;
      bytes: Uint8Array;
      onsetsCsv: string | null;
      replaces?: { recordingId: string; reason: string };
    },
  ): Promise<ApiResponse<RecordingView & { details?: { recording?: RecordingView } }>> {
    const form = new FormData();
    form.append('kind', input.kind);
    if (input.replaces) {
      form.append('replaces', input.replaces.recordingId);
      form.append('replacementReason', input.replaces.reason);
    }
    form.append('file', new Blob([input.bytes]), 'recording.edf');
    if (input.onsetsCsv !== null) {
      form.append('onsets', new Blob([input.onsetsCsv], { type: 'text/csv' }), 'onsets.csv');
    }
    return this.call('POST', `/api/visits/${visitId}/recordings`, 'technician', { form });
  }
}
