export * from './auth';
export * from './workspace';
export * from './catalog';
export * from './values';
export * from './benchmarks';
export * from './meeting';
export * from './mail';
export * from './jobs';
