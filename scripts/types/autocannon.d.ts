// The part of autocannon's API that `npm run bench:api` uses (the package ships no types).
declare module 'autocannon' {
  export interface Request {
    method?: string
    path?: string
    headers?: Record<string, string>
    body?: string
    /** Called before each send; returns the request to send. */
    setupRequest?: (request: Request, context: Record<string, unknown>) => Request
  }

  export interface Client {
    setRequests: (requests: Request[]) => void
  }

  export interface Options {
    url: string
    connections?: number
    /** Seconds. */
    duration?: number
    method?: string
    headers?: Record<string, string>
    requests?: Request[]
    /** Called once for each connection. */
    setupClient?: (client: Client) => void
  }

  /** Latencies in milliseconds, request rates per second. */
  export interface Histogram { average: number, p50: number, p99: number, max: number }

  export interface Result {
    'requests': Histogram
    'latency': Histogram
    'non2xx': number
    '5xx': number
    'errors': number
    'timeouts': number
    'statusCodeStats': Record<string, { count: number }>
  }

  export default function autocannon(options: Options): Promise<Result>
}
