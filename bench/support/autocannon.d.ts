// The part of autocannon 8's API the benchmarks use (the package ships no types).
declare module "autocannon" {
  interface Percentiles {
    average: number;
    mean: number;
    stddev: number;
    min: number;
    max: number;
    total: number;
    p50: number;
    p90: number;
    p97_5: number;
    p99: number;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    pipelining?: number;
    timeout?: number;
    method?: string;
    headers?: Record<string, string>;
    body?: string;
  }
  interface Result {
    duration: number;
    errors: number;
    timeouts: number;
    non2xx: number;
    "2xx": number;
    latency: Percentiles;
    requests: Percentiles & { sent: number };
    throughput: Percentiles;
  }
  function autocannon(opts: Options): Promise<Result>;
  export default autocannon;
  export type { Options, Result };
}
