/**
 * Addresses of the API, built in one place: `apiPath('scan', code)` is `/api/scan/<code>`,
 * `cellarPath(cellarId, 'vessels', id)` is `/api/cellars/<cellarId>/vessels/<id>`. Every part
 * is URL-encoded, so an id can never change the path.
 */
export function apiPath(...segments: string[]): string {
  return `/api/${segments.map(encodeURIComponent).join('/')}`;
}

/**
 * A path under one cellar, where the server's access gate checks the caller's role.
 * @param segments - the resource and what follows it, e.g. `'batches', batchId, 'readings'`
 */
export function cellarPath(cellarId: string, ...segments: string[]): string {
  return apiPath('cellars', cellarId, ...segments);
}

/**
 * The path with a query string of the filled-in parameters only (undefined, null and '' are
 * left out, so the server applies its defaults).
 */
export function withQuery(path: string, params: object): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `${path}?${text}` : path;
}
