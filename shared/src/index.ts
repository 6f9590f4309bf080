export * from './api';
export * from './roles';
export * from './permissions';
export * from './accounts';
export * from './study-model';
export * from './audit';
export * from './mail';
export * from './recordings';
