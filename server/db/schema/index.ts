export * from './users';
export * from './sites';
export * from './units';
export * from './history';
export * from './mail';
export * from './fleet';
