/** The curl line a Keeper can try a new token with (the same shape as the README's example). */
export function curlExample(origin: string, token: string): string {
  return [
    `curl -X POST ${origin}/api/ingest/readings \\`,
    `  -H "Authorization: Bearer ${token}" \\`,
    `  -H "Content-Type: application/json" \\`,
    `  -d '{"sg": 1.050, "temperature": 19.5}'`,
  ].join('\n');
}
