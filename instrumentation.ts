export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { installPeerAddressHeader } = await import('./lib/peer-address');
    installPeerAddressHeader();
    const { startServerServices } = await import('./lib/server-start');
    await startServerServices();
  }
}
