export * from './api';
export * from './roles';
export * from './permissions';
