/** Test helper: the vertices of an `M x y l dx dy …` path, in tenths of a px (exact integers). */
export function pathVertices(d: string): [number, number][] {
  const numbers = (d.match(/-?(?:\d+\.?\d*|\.\d+)/g) ?? []).map((t) => Math.round(Number(t) * 10));
  const out: [number, number][] = [[numbers[0]!, numbers[1]!]];
  for (let i = 2; i + 1 < numbers.length; i += 2) {
    const [x, y] = out[out.length - 1]!;
    out.push([x + numbers[i]!, y + numbers[i + 1]!]);
  }
  return out;
}
