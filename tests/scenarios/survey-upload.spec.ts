import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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
];

describe('survey CSV upload', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  const upload = (csv: string | Buffer, name = 'survey.csv') =>
    h
      .call('post', `/scenarios/${MOOR}/datasets`, h.demo.serverKey)
      .attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv), name);
  const stored = async () =>
    (await h.call('get', `/scenarios/${MOOR}/datasets`, h.demo.serverKey).expect(200)).body.datasets
      .length as number;

  it.each(MALFORMED)('refuses %s at its line and column, storing nothing', async (...c) => {
    const [, csv, line, column, message] = c;
    const before = await stored();
    const res = await upload(csv).expect(400);
    expect(res.body.type).toMatch(/invalid-csv/);
    expect(res.body.errors[0]).toMatchObject({ pointer: '/file', line, column });
    expect(res.body.errors[0].message).toMatch(message);
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
});
