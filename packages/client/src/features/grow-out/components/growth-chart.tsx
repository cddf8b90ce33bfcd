import { CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { GrowthChartDto, WeightUnit } from '@burrowline/shared';
import { chartUnit, chartValue } from '../../../lib/weights';

/**
 * The group's mean weight by age against the co-op's average for the same breed or cross, the published
 * gain (28.8 g/day birth to 8 weeks, Rao et al. 1977) and the projection model's curve, in the farm's units.
 */
export function GrowthChart({ chart, unit }: { chart: GrowthChartDto; unit: WeightUnit }) {
  const v = (g: number) => chartValue(g, unit);
  const group = chart.group.map((p) => ({ ageDays: p.ageDays, group: v(p.grams) }));
  const coop = chart.coop.filter((p) => p.grams !== null).map((p) => ({ ageDays: p.ageDays, coop: v(p.grams!) }));
  const published = chart.published.map((p) => ({ ageDays: p.ageDays, published: v(p.grams) }));
  const projection = chart.projection.map((p) => ({ ageDays: p.ageDays, projection: v(p.grams) }));
  const maxAge = Math.max(84, ...chart.projection.map((p) => p.ageDays), ...chart.group.map((p) => p.ageDays));
  const u = chartUnit(unit);
  return (
    <figure className="space-y-2">
      <div className="h-72 w-full sm:h-80" role="img" aria-label={`Growth chart: the group's mean weight by age in ${u}, the co-op average for ${chart.coopLabel}, and the published gain line`}>
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 4 }}>
            <CartesianGrid stroke="#e5e2da" strokeDasharray="3 3" />
            <XAxis type="number" dataKey="ageDays" domain={[0, maxAge]} tickCount={8} label={{ value: 'Age (days)', position: 'insideBottom', offset: -12 }} />
            <YAxis type="number" width={48} label={{ value: u, angle: -90, position: 'insideLeft' }} />
            <Tooltip formatter={(value) => `${String(value)} ${u}`} labelFormatter={(age) => `Day ${String(age)}`} />
            <ReferenceLine y={v(chart.targetGrams)} stroke="#B5532F" strokeDasharray="6 4" label={{ value: 'Target', position: 'insideTopLeft' }} />
            <Line data={published} dataKey="published" name="Published 28.8 g/day (Rao 1977)" stroke="#8a7a5c" strokeDasharray="2 4" dot={false} isAnimationActive={false} />
            <Line data={coop} dataKey="coop" name={`Co-op average, ${chart.coopLabel}`} stroke="#c9a227" strokeWidth={2} strokeDasharray="6 3" dot={{ r: 3 }} isAnimationActive={false} />
            <Line data={projection} dataKey="projection" name="Projection" stroke="#7fa37a" strokeWidth={2} dot={false} isAnimationActive={false} />
            <Line data={group} dataKey="group" name="This group" stroke="#2F5D50" strokeWidth={2} dot={{ r: 5, fill: '#2F5D50' }} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      {/* Our own legend in the page's flow: it wraps on a phone instead of eating into the plot. */}
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label="Lines in the chart">
        {[
          { name: 'This group', colour: '#2F5D50', dash: '' },
          { name: 'Projection', colour: '#7fa37a', dash: '' },
          { name: `Co-op average, ${chart.coopLabel}`, colour: '#c9a227', dash: '6 3' },
          { name: 'Published 28.8 g/day (Rao 1977)', colour: '#8a7a5c', dash: '2 4' },
          { name: 'Target', colour: '#B5532F', dash: '6 4' },
        ].map((line) => (
          <li key={line.name} className="flex items-center gap-2">
            <svg width="24" height="8" aria-hidden="true"><line x1="0" y1="4" x2="24" y2="4" stroke={line.colour} strokeWidth="3" strokeDasharray={line.dash} /></svg>
            {line.name}
          </li>
        ))}
      </ul>
      <figcaption className="text-sm text-grey-600">
        Dots: this group&apos;s mean weight at each accepted weigh-in. Co-op average: every farm&apos;s groups of {chart.coopLabel}, counted by heads (no farm is named).
        Published line: {chart.publishedSource}.
      </figcaption>
    </figure>
  );
}
