export * from './audit';
export * from './auth';
export * from './customers';
export * from './lab-settings';
export * from './mail-outbox';
export * from './seed-runs';
export * from './jobs';
export * from './templates';
