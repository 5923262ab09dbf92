export * from './auth';
export * from './customers';
export * from './lab-settings';
export * from './mail-outbox';
export * from './seed-runs';
