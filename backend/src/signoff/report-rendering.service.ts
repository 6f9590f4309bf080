import { Injectable, OnModuleDestroy } from '@nestjs/common';
import { ReportRenderer } from '../report-document/report-renderer';
import { VisitReportModel } from '../report-document/visit-report-model';

/** The report renderer's worker thread, closed with the application. */
@Injectable()
export class ReportRenderingService implements OnModuleDestroy {
  private readonly renderer = new ReportRenderer();

  render(model: VisitReportModel): Promise<Buffer> {
    return this.renderer.render(model);
  }

  onModuleDestroy(): Promise<void> {
    return this.renderer.close();
  }
}
