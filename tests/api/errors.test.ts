import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../helpers/context';

describe('the error shape', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when an /api route does not exist, then it answers 404 JSON in the error shape', async () => {
    const res = await request(ctx.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.type).toBe('application/json');
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
  });

  it('when a body is malformed JSON, then it answers 400 in the error shape', async () => {
    const res = await request(ctx.app)
      .post('/api/anything')
      .set('Content-Type', 'application/json')
      .send('{"name": "oops",');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: { code: 'invalid_json', message: expect.any(String) } });
  });

  it('when a state-changing request comes from a foreign Origin, then it is refused with 403', async () => {
    const res = await request(ctx.app)
      .post('/api/anything')
      .set('Origin', 'https://evil.example.net')
      .send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('foreign_origin');
  });

  it('when a request comes from the app origin, then the origin check lets it through', async () => {
    const res = await request(ctx.app).post('/api/anything').set('Origin', ctx.config.appOrigin).send({});
    expect(res.status).toBe(404);
  });
});
