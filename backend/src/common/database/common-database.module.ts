import { Global, Module } from '@nestjs/common';
import { SqliteReads } from './sqlite-reads.service';
import { WriteTransactions } from './write-transactions.service';

@Global()
@Module({ providers: [WriteTransactions, SqliteReads], exports: [WriteTransactions, SqliteReads] })
export class CommonDatabaseModule {}
