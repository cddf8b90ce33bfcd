import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, XAxis, YAxis } from 'recharts';
import { Link } from 'react-router-dom';
import { KIT_DEATH_CAUSE_LABELS, kitDeathCauses, formatWeight, type BreedingRecordDto, type WeightUnit } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { PageSpinner } from '../../../components/ui/spinner';
import { formatDate } from '../../../lib/days';
import { animalName } from '../../../lib/names';
import { useBreedingRecord } from '../api/get-breeding-record';
import { CycleBadge, NextAction } from './cycle-badge';

const percent = (v: number | null) => (v === null ? '—' : `${Math.round(v * 100)} %`);
const oneDecimal = (v: number | null) => (v === null ? '—' : (Math.round(v * 10) / 10).toLocaleString());

const serviceWords: Record<BreedingRecordDto['services'][number]['status'], string> = {
  open: 'Waiting to kindle',
  kindled: 'Kindled',
  empty: 'Palpated empty',
  missed: 'Missed',
};

function Figure({ label, value, hint }: { label: string; value: string; hint?: string }) {
  return (
    <div className="rounded-xl bg-oat p-3">
      <dt className="text-sm text-grey-700">{label}</dt>
      <dd className="text-2xl font-bold text-bark">{value}</dd>
      {hint && <dd className="text-sm text-grey-600">{hint}</dd>}
    </div>
  );
}

/** Each litter as a bar: kits weaned, still with her, lost, culled or fostered away, and born dead. */
function LitterChart({ record }: { record: BreedingRecordDto }) {
  const data = [...record.litters].reverse().map((l) => ({
    name: formatDate(l.kindledOn),
    weaned: l.weaned,
    onDoe: l.onDoe,
    lost: l.lost + l.culled,
    away: l.fosteredOut,
    bornDead: l.bornDead,
  }));
  const summary = data.map((d) => `${d.name}: ${d.weaned} weaned, ${d.onDoe} with her, ${d.lost} lost or culled, ${d.bornDead} born dead`).join('; ');
  return (
    <figure className="space-y-2">
      <div style={{ height: 240 }} role="img" aria-label={`Her litters: ${summary}`}>
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 8, right: 8, bottom: 4, left: -16 }}>
            <CartesianGrid vertical={false} stroke="#e0dbd1" />
            <XAxis dataKey="name" tick={{ fill: '#3b2f2a', fontSize: 12 }} />
            <YAxis allowDecimals={false} tick={{ fill: '#5a544d', fontSize: 12 }} />
            <Legend wrapperStyle={{ fontSize: 13 }} formatter={(value) => <span style={{ color: '#3b2f2a' }}>{value}</span>} />
            <Bar dataKey="weaned" name="Weaned" stackId="kits" fill="#2f5d50" isAnimationActive={false} />
            <Bar dataKey="onDoe" name="With her" stackId="kits" fill="#7fa89b" isAnimationActive={false} />
            <Bar dataKey="away" name="Fostered away" stackId="kits" fill="#c9c1b3" isAnimationActive={false} />
            <Bar dataKey="lost" name="Lost or culled" stackId="kits" fill="#b5532f" isAnimationActive={false} />
            <Bar dataKey="bornDead" name="Born dead" stackId="kits" fill="#3b2f2a" isAnimationActive={false} radius={[4, 4, 0, 0]} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-sm text-grey-600">Kits of each litter and what became of them, oldest litter first.</figcaption>
    </figure>
  );
}

/** A doe's breeding record on her page: where she stands, her figures, a chart of her litters, and every service and litter. */
export function BreedingRecord({ doeId, unit }: { doeId: string; unit: WeightUnit }) {
  const query = useBreedingRecord(doeId);
  if (query.isError) return <Alert tone="error">{query.error.message}</Alert>;
  if (!query.data) return <PageSpinner />;
  const r = query.data;
  const f = r.figures;
  const deaths = kitDeathCauses.filter((c) => f.deaths[c] > 0);
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <CycleBadge cycle={r.cycle} />
        <NextAction next={r.cycle.next} today={r.today} />
      </div>
      {r.services.length === 0 && r.litters.length === 0 ? (
        <p className="text-grey-600">No services or litters recorded for her on this farm yet.</p>
      ) : (
        <>
          <dl className="grid grid-cols-2 gap-3 lg:grid-cols-4">
            <Figure label="Services" value={String(f.services)} hint={`${f.conceptions} conceived`} />
            <Figure label="Conception rate" value={percent(f.conceptionRate)} hint="litters over services with an outcome" />
            <Figure label="Born alive a litter" value={oneDecimal(f.bornAlivePerLitter)} hint={`${f.bornAlive} alive, ${f.bornDead} dead in ${f.litters}`} />
            <Figure label="Weaned a litter" value={oneDecimal(f.weanedPerLitter)} hint={`survival ${percent(f.survivalToWeaning)}`} />
            <Figure label="Kindling interval" value={f.kindlingIntervalDays === null ? '—' : `${Math.round(f.kindlingIntervalDays)} d`} hint="kindling to kindling" />
            <Figure label="Weaning weight a kit" value={f.weaningGramsPerKit === null ? '—' : formatWeight(Math.round(f.weaningGramsPerKit), unit)} />
            <Figure label="Fostered in / out" value={`${f.fosteredIn} / ${f.fosteredOut}`} />
            <Figure label="Kits lost" value={String(f.lost)} hint={f.culled > 0 ? `${f.culled} culled besides` : undefined} />
          </dl>
          {deaths.length > 0 && (
            <div className="space-y-2">
              <h3 className="font-semibold">Why kits died</h3>
              <ul className="flex flex-wrap gap-2" aria-label="Kits lost by cause">
                {deaths.map((c) => (
                  <li key={c}>
                    <Badge tone={c === 'unknown' || c === 'other' ? 'neutral' : 'clay'}>
                      {KIT_DEATH_CAUSE_LABELS[c]}: {f.deaths[c]}
                    </Badge>
                  </li>
                ))}
              </ul>
            </div>
          )}
          {r.litters.length > 0 && <LitterChart record={r} />}
          {r.litters.length > 0 && (
            <div className="space-y-2">
              <h3 className="font-semibold">Litters</h3>
              <div className="hidden overflow-x-auto rounded-xl border border-grey-200 md:block">
                <table className="w-full text-left text-sm">
                  <caption className="sr-only">Her litters, newest first</caption>
                  <thead className="bg-grey-50 text-grey-700">
                    <tr>
                      {['Kindled', 'Sire', 'Born alive', 'Born dead', 'Fostered in / out', 'Lost', 'Weaned', 'Weaning weight', 'Interval'].map((h) => (
                        <th key={h} scope="col" className="px-3 py-2 font-semibold">{h}</th>
                      ))}
                    </tr>
                  </thead>
                  <tbody className="divide-y divide-grey-200">
                    {r.litters.map((l) => (
                      <tr key={l.id}>
                        <td className="px-3 py-2 whitespace-nowrap"><Link className="font-semibold text-moss-deep underline-offset-4 hover:underline" to={`/litters/${l.id}`}>{formatDate(l.kindledOn)}</Link></td>
                        <td className="px-3 py-2">{l.sire ? animalName(l.sire) : '—'}</td>
                        <td className="px-3 py-2">{l.bornAlive}</td>
                        <td className="px-3 py-2">{l.bornDead}</td>
                        <td className="px-3 py-2">{l.fosteredIn} / {l.fosteredOut}</td>
                        <td className="px-3 py-2">{l.lost}{Object.keys(l.deaths).length > 0 && <span className="text-grey-600"> ({Object.entries(l.deaths).map(([c, n]) => `${KIT_DEATH_CAUSE_LABELS[c as keyof typeof KIT_DEATH_CAUSE_LABELS].toLowerCase()} ${n}`).join(', ')})</span>}</td>
                        <td className="px-3 py-2">{l.weaned}{l.onDoe > 0 && <span className="text-grey-600"> ({l.onDoe} with her)</span>}</td>
                        <td className="px-3 py-2 whitespace-nowrap">{l.weaningWeightGrams === null ? '—' : formatWeight(l.weaningWeightGrams, unit)}</td>
                        <td className="px-3 py-2 whitespace-nowrap">{l.daysSincePrevious === null ? '—' : `${l.daysSincePrevious} d`}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              <ul className="space-y-2 md:hidden" aria-label="Her litters, newest first">
                {r.litters.map((l) => (
                  <li key={l.id} className="rounded-xl border border-grey-200 p-3">
                    <Link className="font-semibold text-moss-deep" to={`/litters/${l.id}`}>Kindled {formatDate(l.kindledOn)}</Link>
                    <p className="text-grey-700">
                      {l.bornAlive} alive, {l.bornDead} dead · {l.weaned} weaned{l.onDoe > 0 ? `, ${l.onDoe} with her` : ''} · {l.lost} lost
                    </p>
                    {(l.weaningWeightGrams !== null || l.daysSincePrevious !== null) && (
                      <p className="text-sm text-grey-600">
                        {l.weaningWeightGrams !== null && `Weaned at ${formatWeight(l.weaningWeightGrams, unit)} in all`}
                        {l.weaningWeightGrams !== null && l.daysSincePrevious !== null && ' · '}
                        {l.daysSincePrevious !== null && `${l.daysSincePrevious} days after her previous litter`}
                      </p>
                    )}
                  </li>
                ))}
              </ul>
            </div>
          )}
          {r.services.length > 0 && (
            <div className="space-y-2">
              <h3 className="font-semibold">Services</h3>
              <ul className="divide-y divide-grey-200 rounded-xl border border-grey-200" aria-label="Her services, newest first">
                {r.services.map((s) => (
                  <li key={s.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-3 py-2">
                    <span>
                      <span className="font-semibold">{formatDate(s.servicedOn)}</span>
                      {s.buck && <span className="text-grey-700"> to {animalName(s.buck)}</span>}
                    </span>
                    <span className="text-grey-700">
                      {s.palpation && `Palpated ${s.palpation.result} ${formatDate(s.palpation.palpatedOn)} · `}
                      {serviceWords[s.status]}
                    </span>
                  </li>
                ))}
              </ul>
            </div>
          )}
        </>
      )}
    </div>
  );
}
