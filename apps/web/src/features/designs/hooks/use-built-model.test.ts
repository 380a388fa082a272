import { type DesignSpecInput } from '@kerfwright/contracts';
import { type ColourRule } from '@kerfwright/geometry';
import { act, renderHook, waitFor } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { FakeWorker } from '../../../testing/fake-worker';
import { buildPreview } from '../lib/build-preview';

/** The fake Worker, answering with what the real task gives, and inside act (the page hears of it on a promise). */
class PreviewFakeWorker extends FakeWorker {
  /** Answers the last request with what the real task gives for it, copied as the browser copies it. */
  async answerWithTask() {
    const [spec, count, rule] = this.last.args as [DesignSpecInput, number, ColourRule];
    const value = structuredClone(buildPreview(spec, count, rule));
    await act(async () => this.answer(value));
  }
  async failInAct(message: string) {
    await act(async () => this.fail(message));
  }
}

const design = (solid: string, sides: number, size = 1.2): DesignSpecInput => ({
  solid,
  piece: { sides, step: 1, rotationDeg: 0, size },
  scale: { by: 'diameter', mm: 200 },
  stock: { thicknessMm: 3, flexible: false },
  machine: { kind: 'laser', kerfMm: 0.15 },
});

async function load() {
  vi.resetModules();
  const hook = await import('./use-built-model');
  const layout = await import('../../layout/lib/layout-worker');
  const render = (spec: DesignSpecInput | null) =>
    renderHook((s: DesignSpecInput | null) => hook.useBuiltModel(s, 1, 'neighbour-distinct'), {
      initialProps: spec,
    });
  return { render, runInLayoutWorker: layout.runInLayoutWorker, pauseMs: hook.TYPING_PAUSE_MS };
}

const previewWorkers = () =>
  FakeWorker.made.filter((w) => /preview\.worker/.test(String(w.url))) as PreviewFakeWorker[];

describe('useBuiltModel in the browser (a preview worker)', () => {
  beforeEach(() => {
    FakeWorker.made = [];
    vi.stubGlobal('Worker', PreviewFakeWorker);
  });
  afterEach(() => vi.unstubAllGlobals());

  it('builds the model in a module worker, not on the page, and shows it when it arrives', async () => {
    const { render } = await load();
    const cube = design('cube', 4);
    const { result } = render(cube);
    expect(previewWorkers()).toHaveLength(1);
    const worker = previewWorkers()[0]!;
    expect(worker.options).toEqual({ type: 'module' });
    expect(worker.posted.map((r) => [r.task, r.args])).toEqual([
      ['preview', [cube, 1, 'neighbour-distinct']],
    ]);
    expect(result.current.building).toBe(true);
    expect(result.current.preview.report).toBeNull();
    await worker.answerWithTask();
    expect(result.current.building).toBe(false);
    expect(result.current.preview.report?.pieces).toHaveLength(6);
    // The preview is of the page's own spec (the worker's is a copy).
    expect(result.current.preview.spec).toBe(cube);
  });

  it('keeps the last model on screen while the next builds, and drops a build overtaken by an edit', async () => {
    const { render } = await load();
    const { result, rerender } = render(design('cube', 4));
    const worker = previewWorkers()[0]!;
    await worker.answerWithTask();
    const first = result.current.preview;

    rerender(design('octahedron', 6));
    expect(result.current).toEqual({ preview: first, building: true });
    rerender(design('octahedron', 6, 1.3));
    rerender(design('octahedron', 6, 1.4));
    // The octahedron at 1.2 is no longer wanted: it finishes in the same worker (which stays warm), unheard;
    // 1.3 was overtaken before it started and never runs; 1.4 runs next.
    expect(worker.terminated).toBe(false);
    expect(previewWorkers()).toHaveLength(1);
    const sizes = () => worker.posted.map((r) => (r.args[0] as DesignSpecInput).piece.size);
    expect(sizes()).toEqual([1.2, 1.2]);
    await worker.answerWithTask();
    expect(result.current).toEqual({ preview: first, building: true });
    expect(sizes()).toEqual([1.2, 1.2, 1.4]);
    await worker.answerWithTask();
    expect(result.current.building).toBe(false);
    expect(result.current.preview.report?.pieces).toHaveLength(8);
    expect(result.current.preview.report?.piece.size).toBe(1.4);
  });

  it('waits for a pause in the edits before building a model whose last build was slow', async () => {
    const { render, pauseMs } = await load();
    // 120 pieces × 119 × 14 sides = 199,920, just under the work limit: its build takes a good part of a second.
    const heavy = (size: number) => design('disdyakis-triacontahedron', 14, size);
    const { result, rerender } = render(heavy(1.2));
    const worker = previewWorkers()[0]!;
    await worker.answerWithTask();
    expect(result.current.preview.buildMs).toBeGreaterThan(pauseMs);

    // Typed key by key: nothing is sent until the edits pause, then the last value alone.
    rerender(heavy(1.3));
    rerender(heavy(1.35));
    expect(worker.posted).toHaveLength(1);
    expect(result.current.building).toBe(true);
    await waitFor(() => expect(worker.posted).toHaveLength(2));
    expect((worker.posted[1]!.args[0] as DesignSpecInput).piece.size).toBe(1.35);
  });

  it("shows the engine's refusal of a design too heavy, and a stopped worker's reason, as sentences", async () => {
    const { render } = await load();
    const { result, rerender } = render(design('disdyakis-triacontahedron', 15));
    await previewWorkers()[0]!.answerWithTask();
    expect(result.current.preview.report).toBeNull();
    expect(result.current.preview.failure).toMatch(
      /^This design is too heavy to compute in time: 120 pieces/,
    );

    rerender(design('cube', 4));
    await previewWorkers()[0]!.failInAct('out of memory');
    expect(result.current.building).toBe(false);
    expect(result.current.preview.failure).toBe('Out of memory.');
  });

  it('does not wait behind a layout running in the layout worker', async () => {
    const { render, runInLayoutWorker } = await load();
    void runInLayoutWorker('studio', [design('cube', 4), 1, 'neighbour-distinct', null]).promise;
    const cube = design('cube', 4);
    render(cube);
    const layoutWorker = FakeWorker.made.find((w) => /layout\.worker/.test(String(w.url)));
    expect(layoutWorker?.posted).toHaveLength(1);
    // The layout has not answered, yet the model's build is already with its own worker.
    expect(previewWorkers()).toHaveLength(1);
    expect(previewWorkers()[0]!.posted).toHaveLength(1);
  });
});

describe('useBuiltModel without Worker support (jsdom)', () => {
  it('builds the model on the main thread', async () => {
    expect(typeof Worker).toBe('undefined');
    const { render } = await load();
    const { result } = render(design('cube', 4));
    await waitFor(() => expect(result.current.preview.report?.pieces).toHaveLength(6));
    expect(result.current.building).toBe(false);
  });

  it('has nothing to build without a spec', async () => {
    const { render } = await load();
    const { result } = render(null);
    expect(result.current).toMatchObject({ building: false, preview: { report: null, failure: null } });
  });
});
