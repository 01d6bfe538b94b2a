/** Writes a zod issue path as a JSON path: ["seasons", 0, "months"] → ".seasons[0].months". */
export function formatZodPath(path: readonly (string | number)[]): string {
  return path.map((part) => (typeof part === 'number' ? `[${part}]` : /^[A-Za-z_$][\w$]*$/.test(part) ? `.${part}` : `[${JSON.stringify(part)}]`)).join('');
}
