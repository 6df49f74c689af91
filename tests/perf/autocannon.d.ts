// The few parts of autocannon 9 the benchmark uses (the package ships no types).
declare module 'autocannon' {
  namespace autocannon {
    interface Options {
      url: string
      method?: string
      body?: string
      headers?: Record<string, string>
      connections?: number
      duration?: number
      timeout?: number
    }
    interface Histogram { average: number, p50: number, p99: number }
    interface Result {
      requests: Histogram
      latency: Histogram
      errors: number
      timeouts: number
      non2xx: number
    }
    interface Instance { stop: () => void }
  }
  function autocannon(options: autocannon.Options, done: (err: Error | null, result: autocannon.Result) => void): autocannon.Instance
  export default autocannon
}
