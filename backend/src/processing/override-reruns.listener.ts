import { Injectable, Logger } from '@nestjs/common';
import { OnEvent } from '@nestjs/event-emitter';
import { AnalysisEvents } from '../analysis/analysis.events';
import type { VisitOverrideChanged } from '../analysis/analysis.events';
import { RecordingsService } from '../recordings/recordings.service';

/** A visit's new analysis choices apply at once: its current recordings are computed again. */
@Injectable()
export class OverrideRerunsListener {
  private readonly logger = new Logger('OverrideReruns');

  constructor(private readonly recordings: RecordingsService) {}

  @OnEvent(AnalysisEvents.VisitOverrideChanged, { async: true, promisify: true })
  async onOverride(event: VisitOverrideChanged): Promise<void> {
    try {
      const current = await this.recordings.currentOfVisits([event.visitId]);
      const computable = current.filter((r) => r.state === 'ready' || r.state === 'failed');
      if (computable.length === 0) return;
      await this.recordings.requestComputations(computable, {
        trigger: 'override',
        actor: event.actor,
        reason: `Visit analysis choices, revision ${event.revision}: ${event.reason}`,
      });
    } catch (error) {
      this.logger.error(`Visit ${event.visitId}: ${String(error)}`);
    }
  }
}
