// Malformed requests named one by one: each gets a clear 4xx in the error shape, never a 500.
// (tests/api/fuzz-input.test.ts throws thousands of such requests at every JSON route.)
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';

describe('hostile input', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let lotId: string;
  let tomato: string;
  const lotBody = () => ({
    speciesId: tomato,
    variety: 'Red',
    origin: 'saved',
    harvestDate: '2025-08-01',
    seedCount: 40,
  });

  beforeAll(async () => {
    ctx = await createTestContext();
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send(lotBody());
    expect(lot.status).toBe(201);
    lotId = lot.body.lot.id;
  });
  afterAll(() => ctx.close());

  const lots = () => `/api/banks/${bank.bankId}/lots`;
  const lotCount = async () =>
    (
      await ctx.db
        .selectFrom('lots')
        .select((eb) => eb.fn.countAll<string>().as('n'))
        .where('bank_id', '=', bank.bankId)
        .executeTakeFirstOrThrow()
    ).n;

  describe('charset and encoding', () => {
    it.each(['latin1', 'ISO-8859-1', 'utf-16', 'nonsense'])(
      'when a JSON body declares charset=%s, then it is 415 unsupported_charset',
      async (charset) => {
        const res = await bank.grower.agent
          .post(lots())
          .set('Content-Type', `application/json; charset=${charset}`)
          .send(JSON.stringify(lotBody()));
        expect(res.status).toBe(415);
        expect(res.body.error.code).toBe('unsupported_charset');
        expect(res.body.error.message).toMatch(/UTF-8/);
      },
    );

    it('when a JSON body declares charset=UTF-8 in any letter case, then it is read', async () => {
      const res = await bank.grower.agent
        .post(lots())
        .set('Content-Type', 'application/json; charset="UTF-8"')
        .send(JSON.stringify(lotBody()));
      expect(res.status).toBe(201);
    });

    it('when the Content-Encoding is unknown, then it is 415 unsupported_encoding naming it', async () => {
      const res = await bank.grower.agent
        .post(lots())
        .set('Content-Type', 'application/json')
        .set('Content-Encoding', 'compress')
        .send(JSON.stringify(lotBody()));
      expect(res.status).toBe(415);
      expect(res.body.error).toEqual({
        code: 'unsupported_encoding',
        message: expect.stringMatching(/"compress"/),
      });
    });

    it('when a gzip body is corrupt, then it is 400 and nothing is written', async () => {
      const before = await lotCount();
      const gz = zlib.gzipSync(JSON.stringify(lotBody()));
      const res = await bank.grower.agent
        .post(lots())
        .set('Content-Type', 'application/json')
        .set('Content-Encoding', 'gzip')
        .serialize((raw: Buffer) => raw as unknown as string) // sent as bytes, not as JSON
        .send(Buffer.concat([gz.subarray(0, 20), Buffer.from('not deflate data at all')]));
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('unreadable_request');
      expect(await lotCount()).toBe(before);
    });

    it('when a gzip body is sound, then it is read', async () => {
      const res = await bank.grower.agent
        .post(lots())
        .set('Content-Type', 'application/json')
        .set('Content-Encoding', 'gzip')
        .serialize((raw: Buffer) => raw as unknown as string) // sent as bytes, not as JSON
        .send(zlib.gzipSync(JSON.stringify(lotBody())));
      expect(res.status).toBe(201);
    });
  });

  describe('NUL characters', () => {
    it('when a text field holds a NUL, then it is 400 naming that field and nothing is written', async () => {
      const before = await lotCount();
      const res = await bank.grower.agent.post(lots()).send({ ...lotBody(), notes: 'dry\u0000jar' });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(res.body.error.message).toMatch(/NUL.*"notes"/);
      expect(Object.keys(res.body.error.fields)).toEqual(['notes']);
      expect(await lotCount()).toBe(before);
    });

    it('when nested text holds a NUL, then the field is named by its path', async () => {
      const res = await bank.grower.agent
        .post(lots())
        .send({ ...lotBody(), storage: { place: 'fridge', location: 'shelf\u0000' } });
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ 'storage.location': expect.any(String) });
    });

    it.each(['q', 'cursor'])('when ?%s= holds a NUL, then it is 400 naming it', async (name) => {
      const res = await bank.viewer.agent.get(`${lots()}?${name}=to%00m`);
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ [name]: expect.any(String) });
    });
  });

  describe('missing bodies', () => {
    it('when POST /lots has no body, then it is 400 asking for a JSON body', async () => {
      const res = await bank.grower.agent.post(lots());
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: expect.stringMatching(/missing.*JSON body/),
        fields: { _: expect.any(String) },
      });
    });

    it('when POST /lots/:id/tests has no body, or a text/plain one, then it is 400', async () => {
      const none = await bank.grower.agent.post(`${lots()}/${lotId}/tests`);
      expect(none.status).toBe(400);
      const text = await bank.grower.agent
        .post(`${lots()}/${lotId}/tests`)
        .set('Content-Type', 'text/plain')
        .send('{"startDate":"2026-02-01"}');
      expect(text.status).toBe(400);
      expect(text.body.error.code).toBe('invalid_input');
    });

    it('when a path segment is malformed percent-encoding, then it is 400, not 500', async () => {
      const res = await bank.viewer.agent.get(`${lots()}/%E0%A4%A`);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('unreadable_request');
    });
  });

  describe('malformed multipart', () => {
    const uploads = () => [
      `${lots()}/${lotId}/photos`,
      `${lots()}/import`,
      `/api/banks/${bank.bankId}/tests/import`,
    ];
    const broken: [string, string, string][] = [
      ['no boundary', 'multipart/form-data', '--x\r\n'],
      [
        'a part header without a colon',
        'multipart/form-data; boundary=XyZ',
        '--XyZ\r\nContent-Disposition form-data; name="file"\r\n\r\nabc\r\n--XyZ--\r\n',
      ],
      [
        'a form cut short',
        'multipart/form-data; boundary=XyZ',
        '--XyZ\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\n\r\ncode,species',
      ],
    ];

    it.each(broken)(
      'when the form has %s, then every upload route answers 400 invalid_multipart',
      async (_what, type, body) => {
        for (const path of uploads()) {
          const res = await bank.owner.agent.post(path).set('Content-Type', type).send(body);
          expect(res.status, path).toBe(400);
          expect(res.body.error.code, path).toBe('invalid_multipart');
          expect(res.body.error.message).toMatch(/multipart/);
        }
      },
    );

    it('when an upload route gets JSON instead of a form, then it is 400 asking for the file', async () => {
      for (const path of uploads()) {
        const signedIn = await bank.owner.agent.post(path).send({ file: 'x' });
        expect(signedIn.status, path).toBe(400);
      }
    });
  });
});
