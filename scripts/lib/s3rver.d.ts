// s3rver 3 ships no types: the part of its API the local photo store uses (see its README).
declare module 's3rver' {
  import type { RequestListener } from 'node:http';

  namespace S3rver {
    interface Options {
      readonly silent?: boolean;
      /** Where buckets and objects are kept, one folder per bucket. */
      readonly directory?: string;
      /** Buckets `configureBuckets()` makes when missing. */
      readonly configureBuckets?: readonly { readonly name: string }[];
    }
  }

  /** A Koa application; `callback()` is its request handler for a server of one's own. */
  class S3rver {
    constructor(options?: S3rver.Options);
    configureBuckets(): Promise<unknown>;
    callback(): RequestListener;
  }

  export = S3rver;
}
