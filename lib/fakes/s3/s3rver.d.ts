// The part of s3rver's API the local stand-in uses (the package ships no types).
declare module 's3rver' {
  import type { IncomingMessage, Server, ServerResponse } from 'node:http';

  interface S3rverOptions {
    address?: string;
    port?: number;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    allowMismatchedSignatures?: boolean;
    vhostBuckets?: boolean;
    configureBuckets?: { name: string; configs?: (string | Buffer)[] }[];
  }

  class S3rver {
    constructor(options?: S3rverOptions);
    configureBuckets(): Promise<void>;
    callback(): (req: IncomingMessage, res: ServerResponse) => void;
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
    httpServer?: Server;
    logger?: { close(): void };
  }

  export default S3rver;
}
