// The part of s3rver 3.7 (a devDependency, no bundled types) that lib/storage/fake-s3.ts uses.
declare module "s3rver" {
  import type { IncomingMessage, ServerResponse } from "node:http";

  interface S3rverOptions {
    directory: string;
    silent?: boolean;
    vhostBuckets?: boolean;
    configureBuckets?: { name: string }[];
  }

  export default class S3rver {
    constructor(options: S3rverOptions);
    configureBuckets(): Promise<unknown>;
    /** The Koa request handler. */
    callback(): (req: IncomingMessage, res: ServerResponse) => void;
  }
}
