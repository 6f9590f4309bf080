// Hand-written reader of text/event-stream: the server's stream needs the bearer header, which
// EventSource cannot send, and no fetch-based SSE client is among the installed packages.
import type { RecordingEvent } from '@gyre/shared';
import { RECORDING_STATES } from '@gyre/shared';
import {
  ApiError,
  errorFromResponse,
  getAccessToken,
  refreshAccessToken,
} from '../../../lib/api-client';
import { mightHaveSession } from '../../../lib/session/session-hint';

/** `GET /api/recordings/:id/events`: Server-Sent Events `recording`, until a final state. */
export function recordingEventsPath(recordingId: string): string {
  return `/api/recordings/${encodeURIComponent(recordingId)}/events`;
}

/** One event of the stream, after the format of the HTML standard's "event stream" (§9.2.6). */
export interface StreamEvent {
  type: string;
  data: string;
}

/**
 * Splits text/event-stream into events: lines end with CR LF, LF or CR; `event:` names the
 * type (default `message`), `data:` lines are joined with LF, a line starting with `:` is a
 * comment, a blank line ends the event. Returns the events complete so far and the rest.
 */
export function parseEventStream(buffer: string): { events: StreamEvent[]; rest: string } {
  const text = buffer.replace(/\r\n?/g, '\n');
  const end = text.lastIndexOf('\n\n');
  // No event is complete until a blank line ends it: keep everything for the next chunk.
  if (end === -1) return { events: [], rest: text };
  const events: StreamEvent[] = [];
  for (const block of text.slice(0, end).split('\n\n')) {
    let type = '';
    const data: string[] = [];
    for (const line of block.split('\n')) {
      if (line === '' || line.startsWith(':')) continue;
      const colon = line.indexOf(':');
      const field = colon === -1 ? line : line.slice(0, colon);
      let value = colon === -1 ? '' : line.slice(colon + 1);
      if (value.startsWith(' ')) value = value.slice(1);
      if (field === 'event') type = value;
      else if (field === 'data') data.push(value);
    }
    if (data.length > 0) events.push({ type: type || 'message', data: data.join('\n') });
  }
  return { events, rest: text.slice(end + 2) };
}

function isRecordingEvent(value: unknown): value is RecordingEvent {
  if (typeof value !== 'object' || value === null) return false;
  const event = value as Record<string, unknown>;
  return (
    typeof event.recordingId === 'string' &&
    typeof event.state === 'string' &&
    (RECORDING_STATES as readonly string[]).includes(event.state) &&
    (event.progressPercent === null || typeof event.progressPercent === 'number')
  );
}

async function openStream(recordingId: string, signal: AbortSignal): Promise<Response> {
  const send = () => {
    const headers = new Headers({ Accept: 'text/event-stream' });
    const token = getAccessToken();
    if (token !== null) headers.set('Authorization', `Bearer ${token}`);
    return fetch(recordingEventsPath(recordingId), {
      headers,
      credentials: 'include',
      cache: 'no-store',
      signal,
    });
  };
  if (getAccessToken() === null && mightHaveSession()) await refreshAccessToken();
  const first = await send();
  // An access token expires after 15 minutes: renew it once, as every other request does.
  if (first.status === 401 && (await refreshAccessToken())) return send();
  return first;
}

/**
 * Follows one recording's state through the server's stream: `onEvent` for each event, until
 * the server ends the stream (after a final state) or `signal` aborts. Rejects when the
 * stream cannot be opened or breaks, so the caller can fall back to asking again.
 */
export async function followRecording(
  recordingId: string,
  onEvent: (event: RecordingEvent) => void,
  signal: AbortSignal,
): Promise<void> {
  const response = await openStream(recordingId, signal);
  if (!response.ok) throw errorFromResponse(response.status, await response.text());
  if (response.body === null) {
    throw new ApiError(0, 'STREAM', 'The progress stream could not be read.');
  }
  const reader = response.body.getReader();
  const decoder = new TextDecoder();
  let buffer = '';
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      buffer += decoder.decode(value, { stream: true });
      const parsed = parseEventStream(buffer);
      buffer = parsed.rest;
      for (const event of parsed.events) {
        if (event.type !== 'recording') continue;
        let data: unknown;
        try {
          data = JSON.parse(event.data);
        } catch {
          continue;
        }
        if (isRecordingEvent(data)) onEvent(data);
      }
    }
  } finally {
    reader.releaseLock();
  }
}
