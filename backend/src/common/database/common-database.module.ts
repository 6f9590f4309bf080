import { Global, Module } from '@nestjs/common';
import { WriteTransactions } from './write-transactions.service';

@Global()
@Module({ providers: [WriteTransactions], exports: [WriteTransactions] })
export class CommonDatabaseModule {}
