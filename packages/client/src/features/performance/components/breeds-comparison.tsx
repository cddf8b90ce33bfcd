import { Bar, BarChart, CartesianGrid, LabelList, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { GRAMS_PER_OUNCE, PUBLISHED_FEED_CONVERSION, PUBLISHED_GAIN, type BreedRow, type ComparisonMetric, type MetricSummary, toFixedHalfUp, type WeightUnit } from '@burrowline/shared';
import { Card } from '../../../components/ui/card';
import { dash, sampleWords } from '../performance-format';

interface MetricView {
  metric: ComparisonMetric;
  title: string;
  /** What one unit behind the figure is (a litter, a group, a processing record). */
  noun: string;
  value: (mean: number) => number;
  text: (mean: number) => string;
  /** A published figure to read against, named with its source. */
  reference?: string;
  lowerIsBetter?: boolean;
}

function views(unit: WeightUnit): MetricView[] {
  const gain = unit === 'lb_oz'
    ? { value: (g: number) => Math.round((g / GRAMS_PER_OUNCE) * 100) / 100, text: (g: number) => `${toFixedHalfUp(g / GRAMS_PER_OUNCE, 2)} oz/day` }
    : { value: (g: number) => Math.round(g * 10) / 10, text: (g: number) => `${toFixedHalfUp(g, 1)} g/day` };
  return [
    { metric: 'adgGramsPerDay', title: 'Daily gain in grow-out', noun: 'group', ...gain, reference: `Published: ${PUBLISHED_GAIN.gramsPerDay} g/day${unit === 'lb_oz' ? ` (${toFixedHalfUp(PUBLISHED_GAIN.gramsPerDay / GRAMS_PER_OUNCE, 2)} oz/day)` : ''} from birth to 8 weeks (Rao et al. 1977); gain after weaning is faster` },
    { metric: 'feedConversion', title: 'Feed conversion', noun: 'group', value: (x) => Math.round(x * 100) / 100, text: (x) => x.toFixed(2), lowerIsBetter: true,
      reference: `Published: ${PUBLISHED_FEED_CONVERSION.growOutPellets.ratio} on pellets (World Rabbit Science, NZW line study)` },
    { metric: 'bornAlive', title: 'Litter size (born alive)', noun: 'litter', value: (x) => Math.round(x * 10) / 10, text: (x) => x.toFixed(1), reference: '8–12 born is usual for medium meat breeds (common practice)' },
    { metric: 'dressOutPercent', title: 'Dress-out', noun: 'processing record', value: (x) => Math.round(x * 10) / 10, text: (x) => `${x.toFixed(1)} %`,
      reference: 'Published: 55–56 % head-on for Cal × NZ at 77 days (Kuzelov & Atanasova 2011)' },
  ];
}

const tableViews = (unit: WeightUnit): MetricView[] => {
  const [gain, fcr, born, dress] = views(unit);
  return [
    gain!,
    { metric: 'ageAtTargetDays', title: 'Age at target weight', noun: 'group', value: (x) => x, text: (x) => `${Math.round(x)} d` },
    fcr!,
    born!,
    { metric: 'survivalToWeaning', title: 'Survival to weaning', noun: 'litter', value: (x) => x, text: (x) => `${(x * 100).toFixed(1)} %` },
    dress!,
  ];
};

function Summary({ s, view }: { s: MetricSummary; view: MetricView }) {
  if (s.mean === null) return <span className="text-grey-500">{dash}</span>;
  return (
    <span>
      <span className="font-semibold">{view.text(s.mean)}</span>
      <span className={s.n < 3 ? 'block text-sm font-medium text-clay-deep' : 'block text-sm text-grey-600'}>
        {sampleWords(s.n, view.noun)}{s.n < 3 ? ' — a small sample' : ''}
      </span>
    </span>
  );
}

/** One bar per breed or cross for one figure, each bar labelled with its value and how many it rests on. */
function MetricChart({ rows, view }: { rows: BreedRow[]; view: MetricView }) {
  const data = rows
    .filter((r) => r.metrics[view.metric].mean !== null)
    .map((r) => ({ name: r.label, value: view.value(r.metrics[view.metric].mean!), n: r.metrics[view.metric].n, text: view.text(r.metrics[view.metric].mean!), label: `${view.text(r.metrics[view.metric].mean!)} · n ${r.metrics[view.metric].n}` }));
  return (
    <figure className="space-y-2">
      <figcaption>
        <h3 className="font-semibold text-bark">{view.title}{view.lowerIsBetter ? ' (lower is better)' : ''}</h3>
        {view.reference && <p className="text-sm text-grey-600">{view.reference}</p>}
      </figcaption>
      {data.length === 0 ? (
        <p className="text-grey-600">No figures in this period.</p>
      ) : (
        <div style={{ height: Math.max(120, data.length * 56 + 40) }} role="img" aria-label={`${view.title}: ${data.map((d) => `${d.name} ${d.text} (${sampleWords(d.n, view.noun)})`).join('; ')}`}>
          <ResponsiveContainer width="100%" height="100%">
            <BarChart data={data} layout="vertical" margin={{ top: 4, right: 116, bottom: 4, left: 4 }}>
              <CartesianGrid horizontal={false} stroke="#e0dbd1" />
              <XAxis type="number" tick={{ fill: '#5a544d', fontSize: 12 }} domain={[0, 'auto']} />
              <YAxis type="category" dataKey="name" width={112} tick={{ fill: '#3b2f2a', fontSize: 13 }} />
              <Tooltip formatter={(_v, _n, item) => [`${(item.payload as { text: string }).text} · ${sampleWords((item.payload as { n: number }).n, view.noun)}`, view.title]} />
              <Bar dataKey="value" fill="#2f5d50" radius={[0, 6, 6, 0]} isAnimationActive={false}>
                <LabelList dataKey="label" position="right" fill="#3b2f2a" fontSize={12} formatter={(v) => String(v)} />
              </Bar>
            </BarChart>
          </ResponsiveContainer>
        </div>
      )}
    </figure>
  );
}

/**
 * Breeds and crosses side by side: growth, age at target, feed conversion, litter size, survival and
 * dress-out, each with how many litters, groups or processing records it rests on, so that a small sample
 * reads as small.
 */
export function BreedsComparison({ breeds, unit }: { breeds: BreedRow[]; unit: WeightUnit }) {
  if (breeds.length === 0) return <p className="rounded-2xl border border-dashed border-grey-300 bg-white p-8 text-center text-grey-600">No litters in this period to compare.</p>;
  const columns = tableViews(unit);
  return (
    <div className="space-y-6">
      <div className="hidden overflow-x-auto rounded-2xl border border-grey-200 bg-white shadow-sm md:block">
        <table className="w-full text-left">
          <caption className="sr-only">Breeds and crosses side by side</caption>
          <thead className="border-b border-grey-200 bg-grey-50 text-sm text-grey-700">
            <tr>
              <th scope="col" className="px-4 py-3 font-semibold">Breed or cross</th>
              {columns.map((v) => <th key={v.metric} scope="col" className="px-4 py-3 font-semibold">{v.title}</th>)}
            </tr>
          </thead>
          <tbody className="divide-y divide-grey-200">
            {breeds.map((b) => (
              <tr key={b.key} className="align-top">
                <th scope="row" className="px-4 py-3 text-left font-semibold">
                  {b.label}
                  <span className="block text-sm font-normal text-grey-600">{sampleWords(b.litters, 'litter')}, {sampleWords(b.groups, 'group')}</span>
                </th>
                {columns.map((v) => <td key={v.metric} className="px-4 py-3"><Summary s={b.metrics[v.metric]} view={v} /></td>)}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ul aria-label="Breeds and crosses side by side" className="space-y-3 md:hidden">
        {breeds.map((b) => (
          <li key={b.key} className="rounded-2xl border border-grey-200 bg-white p-4 shadow-sm">
            <p className="text-lg font-semibold">{b.label}</p>
            <p className="text-sm text-grey-600">{sampleWords(b.litters, 'litter')}, {sampleWords(b.groups, 'group')}</p>
            <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
              {columns.map((v) => (
                <div key={v.metric}>
                  <dt className="text-grey-600">{v.title}</dt>
                  <dd><Summary s={b.metrics[v.metric]} view={v} /></dd>
                </div>
              ))}
            </dl>
          </li>
        ))}
      </ul>
      <Card className="grid gap-8 lg:grid-cols-2">
        {views(unit).map((v) => <MetricChart key={v.metric} rows={breeds} view={v} />)}
      </Card>
    </div>
  );
}
