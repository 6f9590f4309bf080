import { Global, Module } from '@nestjs/common';
import { SqliteReadsService } from './sqlite-reads.service';
import { WriteTransactionsService } from './write-transactions.service';

@Global()
@Module({
  providers: [WriteTransactionsService, SqliteReadsService],
  exports: [WriteTransactionsService, SqliteReadsService],
})
export class CommonDatabaseModule {}
