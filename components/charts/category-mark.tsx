import type { CategoryShape } from '@/lib/record/record';

/** One category's mark (shape and colour together, so colour is never the only cue). */
export function CategoryMark({ shape, colour, x, y, size }: { shape: CategoryShape; colour: string; x: number; y: number; size: number }) {
  const s = size;
  if (shape === 'square') return <rect x={x - s * 0.85} y={y - s * 0.85} width={s * 1.7} height={s * 1.7} fill={colour} stroke="#fff" strokeWidth={0.8} />;
  if (shape === 'triangle') return <path d={`M${x},${y - s * 1.1} L${x + s},${y + s * 0.8} L${x - s},${y + s * 0.8} Z`} fill={colour} stroke="#fff" strokeWidth={0.8} />;
  if (shape === 'diamond') return <path d={`M${x},${y - s * 1.15} L${x + s},${y} L${x},${y + s * 1.15} L${x - s},${y} Z`} fill={colour} stroke="#fff" strokeWidth={0.8} />;
  return <circle cx={x} cy={y} r={s} fill={colour} stroke="#fff" strokeWidth={0.8} />;
}
