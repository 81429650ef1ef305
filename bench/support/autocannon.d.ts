// autocannon 8 ships no types: the part of its programmatic API the benchmarks use (see its README).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';

  namespace autocannon {
    interface RequestSpec {
      readonly method?: string;
      readonly path: string;
      readonly headers?: Record<string, string>;
    }

    interface Options {
      readonly url: string;
      readonly connections?: number;
      /** Seconds. */
      readonly duration?: number;
      /** Seconds before a request counts as timed out. */
      readonly timeout?: number;
      readonly headers?: Record<string, string>;
      /** Each connection cycles through these in order. */
      readonly requests?: readonly RequestSpec[];
    }

    /** hdr-histogram-percentiles-obj: only p2_5, p50, p75, p90, p97_5, p99, p99_9… — no p95. */
    interface Histogram {
      readonly average: number;
      readonly mean: number;
      readonly stddev: number;
      readonly min: number;
      readonly max: number;
      readonly total?: number;
      readonly p50: number;
      readonly p99: number;
    }

    interface Result {
      readonly duration: number;
      readonly errors: number;
      readonly timeouts: number;
      readonly non2xx: number;
      readonly latency: Histogram;
      /** Requests completed per one-second sample. */
      readonly requests: Histogram;
      /** Bytes read per one-second sample. */
      readonly throughput: Histogram;
    }

    interface Instance extends EventEmitter, PromiseLike<Result> {
      /** Every response of the measured run; `responseTime` is in milliseconds. */
      on(event: 'response', listener: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): this;
      on(event: string, listener: (...args: unknown[]) => void): this;
    }
  }

  function autocannon(options: autocannon.Options): autocannon.Instance;
  export = autocannon;
}
