import { afterAll, describe, expect, it } from 'vitest';
import { LAKE_DEMO, syntheticSeries, validateCalibrationRequest } from '@tropline/core';
import { CalibrationPool } from '../../server/calibration/calibration-pool';
import type { JobContext } from '../../server/jobs/job-kind';

describe('the calibration pool on worker threads', () => {
  const pool = new CalibrationPool(1);
  afterAll(() => pool.close());

  it('ends the worker thread of a cancelled calibration, not only the job', async () => {
    const times = Array.from({ length: 151 }, (_, i) => i * 2);
    const data = syntheticSeries(LAKE_DEMO.model, LAKE_DEMO.initial, {
      times,
      logSigma: 0.1,
      seed: 5,
    });
    const checked = validateCalibrationRequest({
      model: LAKE_DEMO.model,
      initial: LAKE_DEMO.initial,
      observations: { times: data.times, levels: data.levels },
      parameters: [{ pointer: '/levels/1/mortality', min: 0.4, max: 1.6 }],
      segmentLength: 20,
      starts: 8,
      maxIterations: 200,
    });
    if (!checked.ok) throw new Error(JSON.stringify(checked.errors));
    const controller = new AbortController();
    let reported!: () => void;
    const firstProgress = new Promise<void>((resolve) => (reported = resolve));
    const ctx = {
      owner: 'tenant-under-test',
      signal: controller.signal,
      onProgress: () => reported(),
    } as JobContext;
    const run = pool.run(checked.value, ctx);
    run.catch(() => undefined);
    await firstProgress; // the fit is running on its thread
    const [thread] = pool.workers;
    expect(thread).toBeDefined();
    const exited = new Promise<number>((resolve) => thread!.once('exit', resolve));
    controller.abort(new Error('cancelled by the test'));
    await expect(run).rejects.toThrow(/abort|cancelled/i);
    // The thread computing the fit is terminated (piscina removes a worker whose task aborts).
    await exited;
    expect(pool.workers).not.toContain(thread);
  });
});
