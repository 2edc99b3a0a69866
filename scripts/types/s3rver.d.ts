// The part of @20minutes/s3rver 4's API that the tests and the local cluster use (the package ships no types).
declare module '@20minutes/s3rver' {
  import type { AddressInfo } from 'node:net';

  type Options = {
    address?: string;
    port?: number;
    silent?: boolean;
    directory: string;
    resetOnClose?: boolean;
    allowMismatchedSignatures?: boolean;
    configureBuckets?: { name: string }[];
  };

  export default class S3rver {
    constructor(options: Options);
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
}
