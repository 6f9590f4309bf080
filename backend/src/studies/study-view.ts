import type { StudyView } from '@gyre/shared';
import { Study } from './study.entity';

export function toStudyView(study: Study): StudyView {
  return {
    id: study.id,
    code: study.code,
    name: study.name,
    description: study.description,
    trendMinVisits: study.trendMinVisits,
    trendMinSpanDays: study.trendMinSpanDays,
    blindedReview: study.blindedReview,
    createdAt: study.createdAt,
    updatedAt: study.updatedAt,
  };
}
