/**
 * The input paths a saved work file refers to, read without trusting it: anything that is not
 * a list of `{ path: string }` (inputs) or `{ path }` (chip) yields no paths (the renderer then reports the file as unreadable).
 */
export function referencedInputPaths(workText: string): string[] {
  let data: unknown;
  try {
    data = JSON.parse(workText);
  } catch {
    return [];
  }
  if (typeof data !== 'object' || data === null) return [];
  const inputs = (data as { inputs?: unknown }).inputs;
  if (!Array.isArray(inputs)) return [];
  const out: string[] = [];
  for (const item of inputs.slice(0, 2)) {
    const p = typeof item === 'object' && item !== null ? (item as { path?: unknown }).path : undefined;
    if (typeof p === 'string' && p.length > 0 && p.length <= 4096 && !p.includes('\u0000')) out.push(p);
  }
  const chip = (data as { chip?: unknown }).chip;
  const chipPath = typeof chip === 'object' && chip !== null ? (chip as { path?: unknown }).path : undefined;
  if (typeof chipPath === 'string' && chipPath.length > 0 && chipPath.length <= 4096 && !chipPath.includes('\u0000')) out.push(chipPath);
  return out;
}
