/**
 * The secret of an e-mailed link. It travels in the URL fragment (#token=…), which browsers never
 * send to the server, so it cannot end up in a proxy or server log.
 */
export function tokenFromLocationHash(hash: string): string {
  return new URLSearchParams(hash.replace(/^#/, '')).get('token') ?? '';
}
