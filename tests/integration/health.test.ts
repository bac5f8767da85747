import { describe, expect, it } from 'vitest';
import { Client } from '../helpers/http';

describe('GET /api/health', () => {
  it('reports the database and object storage as reachable when both run', async () => {
    const res = await new Client().fetch('/api/health');
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true, database: true, storage: true });
  });
});
