import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import type { TrajectoryDto, TrajectoryVisitDto } from '@gyre/shared';
import { AnalysisRun } from '../analysis/analysis-run.entity';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { Flag } from '../flags/flag.entity';
import { Participant } from '../participants/participant.entity';
import { Visit } from '../visits/visit.entity';
import { theilSenSlope, yearsBetween } from './theil-sen';
import { TrajectoryError } from './trajectory.errors';

type Metric = 'pafHz' | 'cogHz' | 'deltaFHz';

/**
 * A participant's course over visits (METHOD.md §5): PAF and CoG of the latest resting
 * run and Δf of the latest task run per visit, change from the first visit with a value,
 * Theil–Sen slope in Hz per year over visit dates, and the visits an analyst flagged.
 */
@Injectable()
export class TrajectoryService {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  async forParticipant(caller: Caller, participantId: string): Promise<TrajectoryDto> {
    const participant = await this.dataSource.getRepository(Participant).findOne({
      where: scopedWhere<Participant>(caller.ability, 'read', 'Result', { id: participantId }),
    });
    if (participant === null) {
      throw new GyreException(
        ErrorKind.NotFound,
        TrajectoryError.ParticipantNotFound,
        `No participant ${participantId}.`,
        { participantId },
      );
    }
    const visits = await this.dataSource
      .getRepository(Visit)
      .find({ where: { participantId }, order: { visitDate: 'ASC', label: 'ASC' } });
    const visitIds = visits.map((v) => v.id);
    const runs =
      visitIds.length === 0
        ? []
        : await this.dataSource.getRepository(AnalysisRun).find({
            where: { visitId: In(visitIds) },
            select: {
              id: true,
              visitId: true,
              kind: true,
              pafHz: true,
              cogHz: true,
              roiDeltaFHz: true,
              createdAt: true,
            },
            order: { createdAt: 'DESC', id: 'DESC' },
          });
    const raised =
      visitIds.length === 0
        ? []
        : await this.dataSource
            .getRepository(Flag)
            .find({ where: { visitId: In(visitIds), state: 'raised' }, select: { visitId: true } });
    const flagged = new Set(raised.map((f) => f.visitId));

    const rows = visits.map((visit) => {
      const rest = runs.find((r) => r.visitId === visit.id && r.kind === 'resting');
      const task = runs.find((r) => r.visitId === visit.id && r.kind === 'task');
      return {
        visit,
        pafHz: rest?.pafHz ?? null,
        cogHz: rest?.cogHz ?? null,
        deltaFHz: task?.roiDeltaFHz ?? null,
      };
    });
    const first = (metric: Metric): number | null =>
      rows.find((r) => r[metric] !== null)?.[metric] ?? null;
    const baseline = { pafHz: first('pafHz'), cogHz: first('cogHz'), deltaFHz: first('deltaFHz') };
    const change = (metric: Metric, value: number | null): number | null =>
      value === null || baseline[metric] === null ? null : value - baseline[metric];
    const firstDate = visits[0]?.visitDate;
    const slope = (metric: Metric): number | null => {
      if (firstDate === undefined) return null;
      const points = rows.flatMap((r) => {
        const y = r[metric];
        return y === null ? [] : [{ x: yearsBetween(firstDate, r.visit.visitDate), y }];
      });
      return theilSenSlope(points);
    };
    const out: TrajectoryVisitDto[] = rows.map((r) => ({
      visitId: r.visit.id,
      label: r.visit.label,
      date: r.visit.visitDate,
      pafHz: r.pafHz,
      cogHz: r.cogHz,
      deltaFHz: r.deltaFHz,
      pafChangeHz: change('pafHz', r.pafHz),
      cogChangeHz: change('cogHz', r.cogHz),
      deltaFChangeHz: change('deltaFHz', r.deltaFHz),
      flagged: flagged.has(r.visit.id),
    }));
    return {
      participantId,
      visits: out,
      slopesHzPerYear: { paf: slope('pafHz'), cog: slope('cogHz'), deltaF: slope('deltaFHz') },
    };
  }
}
