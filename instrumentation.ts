export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { startServerServices } = await import('./lib/server-start');
    await startServerServices();
  }
}
