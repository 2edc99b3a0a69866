// The part of autocannon 8's API that scripts/bench.ts uses (the package ships no types).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';

  namespace autocannon {
    interface RawRequest {
      method?: string;
      path?: string;
      headers?: Record<string, string>;
      body?: string | Buffer;
    }
    interface Request extends RawRequest {
      /** Returns the request to send (autocannon starts again from the first request on a falsy value). */
      setupRequest?: (req: RawRequest, context: Record<string, unknown>) => RawRequest | null | undefined;
      onResponse?: (
        status: number,
        body: string,
        context: Record<string, unknown>,
        headers: Record<string, string>,
      ) => void;
    }
    interface Options {
      url: string;
      connections?: number;
      duration?: number;
      amount?: number;
      timeout?: number;
      pipelining?: number;
      headers?: Record<string, string>;
      requests?: Request[];
    }
    interface Result {
      duration: number;
      errors: number;
      timeouts: number;
      non2xx: number;
      requests: { total: number; average: number };
      latency: Record<string, number>;
    }
    interface Instance extends EventEmitter {
      stop(): void;
    }
  }
  function autocannon(opts: autocannon.Options): autocannon.Instance;
  export default autocannon;
}
