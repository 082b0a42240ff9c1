// Every table and its zod schemas. drizzle.config.ts points drizzle-kit here.
export { calendarDate, idParam, isoTimestamp } from './columns';
export * from './permissions';
export * from './auth';
export * from './users';
export * from './organizations';
export * from './sessions';
export * from './sites';
export * from './agents';
export * from './exposure-groups';
export * from './workers';
export * from './audit';
export * from './list-query';
export * from './sampling-plans';
export * from './lab-imports';
export * from './shift-results';
export * from './noise-logs';
export * from './decision-records';
