// JSON answers made partly of text that is JSON already (documents and results as PostgreSQL writes them), so
// that a large value is never parsed and written again in the app. No dependencies.

/** An object's JSON text with more members whose values are JSON texts already (appended in order). */
export function appendRawMembers(object: object, members: [string, string][]): string {
  const head = JSON.stringify(object);
  const rest = members.map(([key, text]) => `${JSON.stringify(key)}:${text}`).join(',');
  if (!rest) return head;
  return head === '{}' ? `{${rest}}` : `${head.slice(0, -1)},${rest}}`;
}
