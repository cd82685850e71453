export * from './types';
export * from './derive';
export * from './explain';
export * from './interval';
