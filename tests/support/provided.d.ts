declare module 'vitest' {
  export interface ProvidedContext {
    apiDatabaseUrl: string;
    e2eDatabaseUrl: string;
    baseUrl: string;
  }
}
export {};
