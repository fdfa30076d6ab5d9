/** The part of autocannon 9's API that bench/load.ts uses (the package ships no types). */
declare module "autocannon" {
  namespace autocannon {
    type Context = Record<string, unknown>;
    interface RawRequest { method?: string; path?: string; headers?: Record<string, string>; body?: string }
    interface Request extends RawRequest {
      setupRequest?: (req: RawRequest, context: Context) => RawRequest | null;
      onResponse?: (status: number, body: string, context: Context, headers: Record<string, string>) => void;
    }
    interface Options {
      url: string;
      connections?: number;
      duration?: number;
      timeout?: number;
      headers?: Record<string, string>;
      method?: string;
      body?: string;
      requests?: Request[];
    }
    interface Histogram { average: number; p50: number; p99: number; max: number }
    /** `requests` also counts the completed requests of the run. */
    interface Counted extends Histogram { total: number }
    interface Result { requests: Counted; latency: Histogram; errors: number; timeouts: number; non2xx: number }
  }
  function autocannon(opts: autocannon.Options): Promise<autocannon.Result>;
  export default autocannon;
}
