// The one schema entry: drizzle-kit (drizzle.config.ts), the Drizzle client and every import of
// `db/schema` read it. Each aggregate's tables sit with their relations in schema/.
export * from './schema/auth';
export * from './schema/farms';
export * from './schema/crops';
export * from './schema/fields';
export * from './schema/herds';
export * from './schema/people';
export * from './schema/prices';
export * from './schema/operations';
export * from './schema/practices';
export * from './schema/rotations';
export * from './schema/plans';
export * from './schema/audit';
export * from './schema/mail';
