import { type TaskRequest } from '../lib/task-worker';

/**
 * Stands in for the browser's Worker (jsdom has none): records what the page posts, copied as the browser
 * copies it (structured clone), and lets the test answer or fail the last request. Every one made is in `made`
 * (empty it before each test); stub it in with vi.stubGlobal('Worker', FakeWorker).
 */
export class FakeWorker {
  static made: FakeWorker[] = [];
  posted: TaskRequest[] = [];
  terminated = false;
  onmessage: ((event: MessageEvent) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  constructor(
    readonly url?: URL,
    readonly options?: WorkerOptions,
  ) {
    FakeWorker.made.push(this);
  }
  postMessage(request: TaskRequest) {
    this.posted.push(structuredClone(request));
  }
  terminate() {
    this.terminated = true;
  }
  /** The request posted last. */
  get last(): TaskRequest {
    return this.posted[this.posted.length - 1] as TaskRequest;
  }
  /** Answers the last request with `value`. */
  answer(value: unknown) {
    this.onmessage?.({ data: { id: this.last.id, ok: true, value } } as MessageEvent);
  }
  /** The worker itself fails (it ran out of memory, its script did not load). */
  fail(message: string) {
    this.onerror?.({ message, preventDefault: () => undefined } as ErrorEvent);
  }
}
