import { describe, expect, it } from 'vitest';
import { Client } from '../helpers/http';

describe('GET /api/health', () => {
  it('reports the database, object storage and the mail server as reachable when all run', async () => {
    const res = await new Client().fetch('/api/health');
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true, database: true, storage: true, mail: true });
  });
});
