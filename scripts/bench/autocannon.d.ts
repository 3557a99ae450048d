// The few parts of autocannon's API the benchmark uses (the package ships no types).
declare module "autocannon" {
  type Options = {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
    requests?: { setupRequest?: (req: Record<string, unknown>) => Record<string, unknown> }[];
  };
  type Result = {
    requests: { average: number; total: number };
    latency: { p50: number; p99: number };
    non2xx: number;
    timeouts: number;
    errors: number;
  };
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
