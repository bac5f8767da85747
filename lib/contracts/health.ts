/** GET /api/health: each dependency's state; 503 only when the database is down. */
export interface Health {
  ok: boolean;
  database: boolean;
  storage: boolean;
  mail: boolean;
}
