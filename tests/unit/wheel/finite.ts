/** Paths of every number in `value` that is NaN or infinite (empty when all are finite). */
export function nonFiniteNumbers(value: unknown, path = '$', out: string[] = []): string[] {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) out.push(`${path} = ${value}`);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => nonFiniteNumbers(v, `${path}[${i}]`, out));
  } else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) nonFiniteNumbers(v, `${path}.${k}`, out);
  }
  return out;
}
