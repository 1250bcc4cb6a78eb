// The part of autocannon's API the load test uses (the package ships no types).
declare module "autocannon" {
  import type { EventEmitter } from "node:events";

  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    method?: string;
    headers?: Record<string, string>;
    body?: string;
    timeout?: number;
  }

  export interface Result {
    requests: { total: number; average: number };
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
  }

  interface Instance extends EventEmitter {
    on(event: "response", listener: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): this;
    on(event: "done", listener: (result: Result) => void): this;
    stop(): void;
  }

  function autocannon(options: Options, callback?: (error: Error | null, result: Result) => void): Instance;
  export default autocannon;
}
