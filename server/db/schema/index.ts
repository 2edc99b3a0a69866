export * from './users';
export * from './sites';
export * from './units';
