// The part of autocannon 8's API the load bench uses (the package ships no types and @types/autocannon is
// not installed).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events'

  namespace autocannon {
    interface Request {
      method?: string
      path?: string
      body?: string
      headers?: Record<string, string>
      /** Called before each request is sent; returns the request to send. */
      setupRequest?: (request: Request, context: Record<string, unknown>) => Request
    }
    interface Options {
      url: string
      connections?: number
      duration?: number
      headers?: Record<string, string>
      requests?: Request[]
    }
    interface Histogram { average: number, mean: number, stddev: number, min: number, max: number, total: number, p50: number, p99: number }
    interface Result {
      duration: number
      requests: Histogram
      latency: Histogram
      errors: number
      timeouts: number
      non2xx: number
    }
    interface Instance extends EventEmitter, PromiseLike<Result> {}
  }

  function autocannon(options: autocannon.Options): autocannon.Instance
  export default autocannon
}
