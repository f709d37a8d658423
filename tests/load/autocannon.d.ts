// Minimal typings for autocannon (the package ships none): what tests/load/drive.ts uses.
declare module "autocannon" {
  namespace autocannon {
    interface Request { method?: string; path?: string; headers?: Record<string, string>; body?: string; onResponse?: (status: number, body: string) => void }
    interface Options { url: string; connections?: number; duration?: number; overallRate?: number; headers?: Record<string, string>; requests?: Request[]; timeout?: number }
    interface Result { errors: number; timeouts: number; non2xx: number; latency: Record<string, number>; requests: Record<string, number> }
    interface Instance extends PromiseLike<Result> { on(event: "response", fn: (client: unknown, statusCode: number, bytes: number, ms: number) => void): void }
  }
  function autocannon(opts: autocannon.Options): autocannon.Instance;
  export = autocannon;
}
