import { getEnv } from './lib/env';

// Fail at start-up, naming each bad variable, rather than at the first request that needs one.
try {
  getEnv();
} catch (err) {
  console.error((err as Error).message);
  process.exit(1);
}
