// The few parts of autocannon's API the benches use (the package ships no types).
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
    statusCodeStats?: Record<string, { count: number | string }>;
  }
  export interface Request {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
    /** Changes the request about to be sent; `context` lives as long as the connection. */
    setupRequest?: (request: Request, context: Record<string, unknown>) => Request;
    onResponse?: (status: number, body: string, context: Record<string, unknown>) => void;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
    requests?: Request[];
  }
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
