export * from './audit';
export * from './users';
export * from './designs';
export * from './revisions';
