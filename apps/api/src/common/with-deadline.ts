/** Settles like `p`, or rejects with "<what> took longer than <ms> ms" once `ms` have passed (the timer never keeps the process alive). */
export function withDeadline<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  return Promise.race([
    p,
    new Promise<T>((_, reject) =>
      setTimeout(() => reject(new Error(`${what} took longer than ${ms} ms`)), ms).unref(),
    ),
  ]);
}
