// The few parts of autocannon's API the bench uses (the package ships no types).
declare module 'autocannon' {
  interface Histogram {
    average: number;
    mean: number;
    p50: number;
    p99: number;
    max: number;
  }
  interface Result {
    requests: Histogram & { total: number };
    latency: Histogram;
    errors: number;
    non2xx: number;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
  }
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
