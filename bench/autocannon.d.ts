// autocannon ships no types; this declares the part the API benchmark uses.
declare module 'autocannon' {
  namespace autocannon {
    interface Request {
      method?: string;
      path?: string;
      headers?: Record<string, string>;
      body?: string;
      setupRequest?: (req: Request) => Request;
    }
    interface Options {
      url: string;
      method?: string;
      connections?: number;
      amount?: number;
      duration?: number;
      headers?: Record<string, string>;
      body?: string;
      requests?: Request[];
    }
    interface Histogram {
      mean: number;
      average: number;
      p50: number;
      p99: number;
      max: number;
    }
    interface Result {
      duration: number;
      errors: number;
      timeouts: number;
      non2xx: number;
      /** Answers by status code. */
      statusCodeStats?: Record<string, { count: number }>;
      latency: Histogram;
      requests: Histogram & { total: number };
    }
  }
  function autocannon(
    options: autocannon.Options,
    done: (err: Error | null, result: autocannon.Result) => void,
  ): unknown;
  export default autocannon;
}
