import { renderVisitReport } from './render-visit-report';
import { VisitReportModel } from './visit-report-model';

/** Worker-thread entry: the same pure renderer, off the event loop. */
export async function render(model: VisitReportModel): Promise<Uint8Array> {
  return renderVisitReport(model);
}
