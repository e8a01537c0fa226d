export * from './audit';
export * from './users';
export * from './designs';
export * from './revisions';
export * from './signoff';
export * from './remarks';
export * from './mailbox';
