import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { testApp } from '../helpers/test-app';

describe('health and unknown routes', () => {
  it('reports the database as up', async () => {
    const { app } = await testApp();
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', database: 'up' });
  });

  it('answers JSON 404 for an unknown API route', async () => {
    const { app } = await testApp();
    const res = await request(app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/json/);
    expect(res.body.error).toBe('not_found');
  });

  it('sends security headers', async () => {
    const { app } = await testApp();
    const res = await request(app).get('/api/health');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
