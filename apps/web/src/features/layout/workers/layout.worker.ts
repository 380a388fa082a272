/// <reference lib="webworker" />
import { type LayoutRequest, type LayoutResponse, runLayoutTask } from '../lib/layout-tasks';

/**
 * The layout worker: nesting a model (and the fit-to-sheets search, a dozen nestings) takes from a few
 * milliseconds to a few seconds, so it runs here, off the page's main thread, and typing never waits for it.
 * One request at a time; the page terminates the worker to drop a request that is no longer wanted.
 */
const scope = self as unknown as DedicatedWorkerGlobalScope;
scope.onmessage = (event: MessageEvent<LayoutRequest>) => {
  const { id, task, args } = event.data;
  let answer: LayoutResponse;
  try {
    answer = { id, ok: true, value: runLayoutTask(task, args) };
  } catch (error) {
    answer = { id, ok: false, message: error instanceof Error ? error.message : String(error) };
  }
  scope.postMessage(answer);
};
