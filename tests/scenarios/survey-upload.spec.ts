import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { UPLAND_DEMO } from '@tropline/core';
import { DEMO_SCENARIOS } from '../../seeds/05-demo-scenarios';
import { startHarness, type Harness } from '../api/api-harness';

// The seeded Hobcairn Moor scenario: levels heather, deer, wolves.
const MOOR = DEMO_SCENARIOS[1]!.id;
const GOOD =
  'time,heather,deer,wolves,deer_se\n0,300,8,0.02,0.8\n1.5,,9.5,0.021,\n4,120,NA,0.03,1.1\n';

/** Each malformed file with the exact line and column it must be refused at. */
const MALFORMED: [string, string, number, number, RegExp][] = [
  ['wrong header', 'year,heather,deer\n0,1,2\n', 1, 1, /first column must be "time"/],
  ['unknown level', 'time,heather,elk\n0,1,2\n', 1, 3, /unknown level "elk"/],
  ['text in a number', 'time,heather,deer\n0,1,2\n1,lots,3\n', 3, 2, /"lots" is not a number/],
  ['negative count', 'time,heather,deer\n0,1,2\n1,2,-3\n', 3, 3, /cannot be negative/],
  ['duplicate time', 'time,heather,deer\n0,1,2\n2,1,2\n2,1,2\n', 4, 1, /duplicate time 2/],
  ['wrong delimiter', 'time;heather;deer\n0;1;2\n', 1, 1, /separated by commas/],
  ['empty', '', 1, 1, /empty/],
  ['short row', 'time,heather,deer\n0,1\n', 2, 3, /expected 3 columns, found 2/],
  // Past the 2000 rows a calibration reads (the byte limit is the 413 case below).
  [
    'too many rows',
    `time,deer\n${Array.from({ length: 2001 }, (_, i) => `${i},5`).join('\n')}\n`,
    2002,
    1,
    /at most 2000 rows/,
  ],
];

describe('survey CSV upload', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  const upload = (csv: string | Buffer, name = 'survey.csv', scenario = MOOR, version?: string) => {
    const test = h.call('post', `/scenarios/${scenario}/datasets`, h.demo.serverKey);
    if (version !== undefined) test.field('scenarioVersion', version);
    return test.attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv), name);
  };
  const stored = async (scenario = MOOR) =>
    (await h.call('get', `/scenarios/${scenario}/datasets`, h.demo.serverKey).expect(200)).body
      .datasets.length as number;

  it.each(MALFORMED)('refuses %s at its line and column, storing nothing', async (...c) => {
    const [, csv, line, column, message] = c;
    const before = await stored();
    // Against the latest version by default, and against a version named by the upload.
    for (const version of [undefined, '1']) {
      const res = await upload(csv, 'survey.csv', MOOR, version).expect(400);
      expect(res.body.type).toMatch(/invalid-csv/);
      expect(res.body.errors[0]).toMatchObject({ pointer: '/file', line, column });
      expect(res.body.errors[0].message).toMatch(message);
    }
    expect(await stored()).toBe(before);
  });

  it('reports every bad row of one file, not just the first', async () => {
    const res = await upload('time,deer\n0,1\n1,x\n2,-1\n3,y\n').expect(400);
    expect(res.body.errors.map((e: { line: number }) => e.line)).toEqual([3, 4, 5]);
  });

  it('refuses a file over the size limit with 413', async () => {
    const before = await stored();
    const rows = Array.from({ length: 60_000 }, (_, i) => `${i},1,2,3`).join('\n');
    const res = await upload(`time,heather,deer,wolves\n${rows}\n`).expect(413);
    expect(res.body.errors[0].pointer).toBe('/file');
    expect(await stored()).toBe(before);
  });

  it('stores a valid file as a new version and gives it back byte for byte', async () => {
    const bytes = Buffer.from(GOOD);
    const res = await upload(bytes, 'moor-2026.csv').expect(201);
    expect(res.body.rows).toBe(3);
    const got = await h
      .call('get', `/scenarios/${MOOR}/datasets/${res.body.version}`, h.demo.serverKey)
      .expect(200);
    expect(got.body.series).toEqual({
      times: [0, 1.5, 4],
      levels: { heather: [300, null, 120], deer: [8, 9.5, null], wolves: [0.02, 0.021, 0.03] },
      standardErrors: { deer: [0.8, null, 1.1] },
    });
    const csv = await h
      .call('get', `/scenarios/${MOOR}/datasets/${res.body.version}/csv`, h.demo.serverKey)
      .buffer(true)
      .parse((r, done) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => done(null, Buffer.concat(chunks)));
      })
      .expect(200);
    expect(Buffer.compare(csv.body as Buffer, bytes)).toBe(0);
  });

  it('asks for the file when none is sent', async () => {
    const res = await h
      .call('post', `/scenarios/${MOOR}/datasets`, h.demo.serverKey)
      .field('changeNote', 'no file')
      .expect(400);
    expect(res.body.errors[0].pointer).toBe('/file');
  });

  describe('a dataset is made for one scenario version', () => {
    // Version 1 is the Hobcairn Moor chain; version 2 counts deer per 100 ha instead of per
    // km²; version 3 drops the wolves.
    let id: string;
    const wolves = 'time,heather,deer,wolves\n0,300,8,0.02\n1,280,8.5,0.021\n2,260,9,0.023\n';
    beforeAll(async () => {
      const v1 = {
        name: 'Hobcairn Moor, survey versions',
        model: UPLAND_DEMO.model,
        initial: UPLAND_DEMO.initial,
        horizon: 50,
      };
      const made = await h
        .call('post', '/scenarios', h.demo.serverKey)
        .send({ ...v1, changeNote: 'First' })
        .expect(201);
      id = made.body.scenario.id;
      const v2 = structuredClone(v1);
      (v2.model.levels[1] as { unit: string }).unit = 'animals per 100 ha';
      await h
        .call('post', `/scenarios/${id}/versions`, h.demo.serverKey)
        .send({ ...v2, changeNote: 'Deer per 100 ha' })
        .expect(201);
      const v3 = structuredClone(v1);
      v3.model = { ...v3.model, levels: v3.model.levels.slice(0, 2) } as typeof v3.model;
      v3.initial = { heather: 300, deer: 8 } as typeof v3.initial;
      await h
        .call('post', `/scenarios/${id}/versions`, h.demo.serverKey)
        .send({ ...v3, changeNote: 'Without wolves' })
        .expect(201);
    });

    it('checks the header against the version the upload names, and records it', async () => {
      const res = await upload(wolves, 'moor-v1.csv', id, '1').expect(201);
      expect(res.body.scenarioVersion).toBe(1);
      expect(res.body.levels).toEqual([
        { id: 'heather', unit: 't dry matter km^-2' },
        { id: 'deer', unit: 'animals km^-2' },
        { id: 'wolves', unit: 'animals km^-2' },
      ]);
      const listed = await h.call('get', `/scenarios/${id}/datasets`, h.demo.serverKey);
      expect(listed.body.datasets[0].scenarioVersion).toBe(1);
      // Without a version the latest (3, no wolves) is the one the header must match.
      const before = await stored(id);
      const latest = await upload(wolves, 'moor.csv', id).expect(400);
      expect(latest.body.errors[0]).toMatchObject({ pointer: '/file', line: 1, column: 4 });
      expect(latest.body.errors[0].message).toMatch(/unknown level "wolves"/);
      expect(latest.body.detail).toMatch(/scenario version 3/);
      expect(await stored(id)).toBe(before);
    });

    it('refuses a version the scenario does not have, naming /scenarioVersion', async () => {
      const before = await stored(id);
      for (const version of ['9', 'two', '0']) {
        const res = await upload(wolves, 'moor.csv', id, version).expect(400);
        expect(res.body.errors[0].pointer, version).toBe('/scenarioVersion');
      }
      expect(await stored(id)).toBe(before);
    });

    it('refuses to calibrate a version whose levels or units differ from the data', async () => {
      const fit = (scenarioVersion: number) =>
        h.call('post', `/scenarios/${id}/calibrations`, h.demo.serverKey).send({
          dataset: 1,
          scenarioVersion,
          parameters: [{ pointer: '/levels/1/mortality', min: 0.05, max: 1.5 }],
          starts: 1,
          maxIterations: 2,
        });
      const noWolves = await fit(3).expect(400);
      expect(noWolves.body.errors[0].pointer).toBe('/dataset');
      expect(noWolves.body.errors[0].message).toMatch(
        /made for scenario version 1; scenario version 3 has no level "wolves"/,
      );
      const otherUnit = await fit(2).expect(400);
      expect(otherUnit.body.errors[0].pointer).toBe('/dataset');
      expect(otherUnit.body.errors[0].message).toMatch(/deer.*animals per 100 ha/);
      const missing = await h
        .call('post', `/scenarios/${id}/calibrations`, h.demo.serverKey)
        .send({ dataset: 7, parameters: [] })
        .expect(400);
      expect(missing.body.errors[0].pointer).toBe('/dataset');
      const job = await fit(1).expect(202);
      expect(job.body.kind).toBe('calibrations');
    });
  });
});
