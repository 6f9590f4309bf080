import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditEntry } from './audit-entry.entity';
import { AuditAnchorService } from './audit-anchor.service';
import { AuditContextReads } from './audit-context.reads';
import { AuditController } from './audit.controller';
import { AuditExportService } from './audit-export.service';
import { AuditService } from './audit.service';
import { AuditedWrites } from './audited-writes';

/** Global: every feature module records into the one trail. */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([AuditEntry])],
  controllers: [AuditController],
  providers: [
    AuditService,
    AuditedWrites,
    AuditExportService,
    AuditAnchorService,
    AuditContextReads,
  ],
  exports: [AuditService, AuditedWrites],
})
export class AuditModule {}
