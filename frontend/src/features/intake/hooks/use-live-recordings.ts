import type { Page, RecordingView, RecordingEvent, RecordingState } from '@gyre/shared';
import { useEffect, useMemo, useState } from 'react';
import { useSWRConfig } from 'swr';
import { followRecording } from '../api/recording-events';
import { isSettled, RECORDINGS_POLL_MS, recordingsPath, useRecordings } from '../api/recordings';

/**
 * At most this many streams at once: a browser keeps about six HTTP/1.1 connections per
 * server, and the rest of the screen needs some. More unsettled recordings than this are
 * followed by asking again instead.
 */
export const MAX_STREAMS = 3;

/** How the screen learns of changes: nothing to follow, the server's stream, or asking again. */
export type LiveMode = 'idle' | 'stream' | 'polling';

/** A recording as the list gave it, with the newest state and progress the stream sent. */
function withLiveState(recording: RecordingView, event: RecordingEvent | undefined): RecordingView {
  // A settled row is the server's last word; the stream only runs ahead of unsettled ones.
  if (event === undefined || isSettled(recording.state)) return recording;
  return {
    ...recording,
    state: event.state,
    progressPercent:
      event.progressPercent ?? (event.state === recording.state ? recording.progressPercent : null),
  };
}

/**
 * The visit's recordings, followed live: one stream (`GET /api/recordings/:id/events`) per
 * recording not yet in a final state shows its state and progress as they happen; each change
 * of state reads the list again (facts, warnings), and a final state also the other views of
 * the visit's recordings and of that recording. If a stream cannot be opened or breaks before
 * a final state, the list is asked again every 1.5 s instead. Streams close when the visit
 * changes or the screen goes (render this under a component keyed by the visit).
 */
export function useLiveRecordings(visitId: string) {
  const { mutate: mutateAny } = useSWRConfig();
  const [live, setLive] = useState<Record<string, RecordingEvent>>({});
  const [polling, setPolling] = useState(false);
  const list = useRecordings(visitId, {
    refreshInterval: (latest) => {
      const unsettled = latest?.items.filter((r) => !isSettled(r.state)).length ?? 0;
      return unsettled > 0 && (polling || unsettled > MAX_STREAMS) ? RECORDINGS_POLL_MS : 0;
    },
  });
  const { mutate } = list;

  // Recordings still on their way, as one stable string so the effect reruns only when it changes.
  const waiting = (list.data?.items ?? [])
    .filter((r) => !isSettled(r.state) && !isSettled(live[r.id]?.state ?? r.state))
    .map((r) => r.id)
    .sort()
    .join(',');

  useEffect(() => {
    if (waiting === '' || polling) return;
    const ids = waiting.split(',');
    if (ids.length > MAX_STREAMS) return;
    const controller = new AbortController();
    const path = recordingsPath(visitId);
    for (const id of ids) {
      let lastState: RecordingState | null = null;
      const onEvent = (event: RecordingEvent) => {
        setLive((all) => ({ ...all, [id]: event }));
        const changed = lastState !== null && event.state !== lastState;
        lastState = event.state;
        if (changed || isSettled(event.state)) void mutate();
        if (isSettled(event.state)) {
          // Every cached view of this visit's recordings (whatever its shape) and of this one.
          void mutateAny(
            (key) =>
              (Array.isArray(key) && key[1] === path) ||
              (typeof key === 'string' && key.startsWith(`/api/recordings/${id}`)),
          );
        }
      };
      followRecording(id, onEvent, controller.signal).then(
        () => {
          // The server ends a stream after a final state; ended before one, it broke.
          if (!controller.signal.aborted && (lastState === null || !isSettled(lastState))) {
            setPolling(true);
          }
        },
        () => {
          if (!controller.signal.aborted) setPolling(true);
        },
      );
    }
    return () => controller.abort();
  }, [waiting, polling, visitId, mutate, mutateAny]);

  // Falling back: start asking again now (the interval is only looked at after each answer).
  useEffect(() => {
    if (polling) void mutate();
  }, [polling, mutate]);

  const data = useMemo<Page<RecordingView> | undefined>(
    () =>
      list.data === undefined
        ? undefined
        : { ...list.data, items: list.data.items.map((r) => withLiveState(r, live[r.id])) },
    [list.data, live],
  );
  const mode: LiveMode =
    waiting === ''
      ? 'idle'
      : polling || waiting.split(',').length > MAX_STREAMS
        ? 'polling'
        : 'stream';
  return { data, error: list.error, isLoading: list.isLoading, mutate, mode };
}
