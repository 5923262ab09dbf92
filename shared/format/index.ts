export * from './number';
export * from './units';
export * from './result';
export * from './date';
export * from './symbols';
