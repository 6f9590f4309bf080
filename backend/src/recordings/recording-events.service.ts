import { Injectable } from '@nestjs/common';
import { filter, Observable, Subject } from 'rxjs';
import type { RecordingEvent } from '@gyre/shared';

/** In-process fan-out of recording state and progress changes, for Server-Sent Events. */
@Injectable()
export class RecordingEventsService {
  private readonly events = new Subject<RecordingEvent>();

  emit(event: RecordingEvent): void {
    this.events.next(event);
  }

  of(recordingId: string): Observable<RecordingEvent> {
    return this.events.pipe(filter((event) => event.recordingId === recordingId));
  }
}
