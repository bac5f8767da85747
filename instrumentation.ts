// Fails the server at start-up, with a message naming each bad variable, instead of at the
// first request that needs one.
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  const { getEnv } = await import('./lib/env');
  try {
    getEnv();
  } catch (err) {
    console.error((err as Error).message);
    process.exit(1);
  }
}
