import type { SiteView } from '@gyre/shared';
import { Site } from './site.entity';

export function toSiteView(site: Site): SiteView {
  return {
    id: site.id,
    studyId: site.studyId,
    code: site.code,
    name: site.name,
    createdAt: site.createdAt,
    updatedAt: site.updatedAt,
  };
}
