// CPU and wall-clock seconds of one synchronous piece of work, for the benchmark scripts.
export function timed<T>(f: () => T): { value: T, cpu: number, wall: number } {
  const c0 = process.cpuUsage()
  const w0 = performance.now()
  const value = f()
  const c = process.cpuUsage(c0)
  return { value, cpu: (c.user + c.system) / 1e6, wall: (performance.now() - w0) / 1000 }
}
