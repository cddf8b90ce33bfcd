import { Bar, BarChart, CartesianGrid, LabelList, ResponsiveContainer, XAxis, YAxis } from 'recharts';

export interface DressOutRow {
  key: string;
  label: string;
  /** Hot dress-out in percent of live weight; null when nothing was weighed. */
  percent: number | null;
  head: number;
}

const headWords = (n: number) => `${n} head`;

/** One bar per farm (or breed and cross) with its dress-out inside; the head it rests on follows the name. */
export function DressOutChart({ title, rows }: { title: string; rows: DressOutRow[] }) {
  const data = rows
    .filter((r) => r.percent !== null)
    .map((r) => ({ name: `${r.label} (${r.head})`, value: Math.round(r.percent! * 10) / 10, label: `${r.percent!.toFixed(1)} %`, head: r.head }));
  return (
    <figure className="space-y-2">
      <figcaption className="font-semibold text-bark">{title}</figcaption>
      {data.length === 0 ? (
        <p className="text-grey-600">No yields recorded yet.</p>
      ) : (
        <div style={{ height: Math.max(110, data.length * 52 + 36) }} role="img" aria-label={`${title}: ${data.map((d) => `${d.name} ${d.label}, ${headWords(d.head)}`).join('; ')}`}>
          <ResponsiveContainer width="100%" height="100%">
            <BarChart data={data} layout="vertical" margin={{ top: 4, right: 12, bottom: 4, left: 4 }}>
              <CartesianGrid horizontal={false} stroke="#e0dbd1" />
              <XAxis type="number" domain={[0, 70]} ticks={[0, 20, 40, 60]} unit=" %" tick={{ fill: '#5a544d', fontSize: 12 }} />
              <YAxis type="category" dataKey="name" width={104} tick={{ fill: '#3b2f2a', fontSize: 13 }} />
              <Bar dataKey="value" fill="#2f5d50" radius={[0, 6, 6, 0]} isAnimationActive={false}>
                <LabelList dataKey="label" position="insideRight" fill="#ffffff" fontSize={13} fontWeight={600} formatter={(v) => String(v)} />
              </Bar>
            </BarChart>
          </ResponsiveContainer>
        </div>
      )}
    </figure>
  );
}
