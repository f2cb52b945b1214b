// The few autocannon options and results the HTTP benchmark uses.
declare module 'autocannon' {
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
  }
  interface Histogram {
    average: number;
    total: number;
    p50: number;
    p99: number;
  }
  interface Result {
    requests: Histogram;
    latency: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
  }
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
