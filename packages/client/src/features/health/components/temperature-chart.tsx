import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { celsiusToFahrenheit, HEAT_CAUTION, type TemperatureReadingDto, type TemperatureUnit } from '@burrowline/shared';

/** The last weeks' readings with the 85 °F / 29.4 °C heat line (lazy route only: recharts stays out of the first load). */
export function TemperatureChart({ readings, unit }: { readings: TemperatureReadingDto[]; unit: TemperatureUnit }) {
  const toUnit = (c: number) => (unit === 'F' ? Math.round(celsiusToFahrenheit(c) * 10) / 10 : c);
  const data = [...readings].reverse().map((r) => ({ at: new Date(r.takenAt).getTime(), value: toUnit(r.celsius) }));
  if (data.length < 2) return null;
  const heatLine = unit === 'F' ? HEAT_CAUTION.fahrenheit : HEAT_CAUTION.celsius;
  const day = new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short' });
  return (
    <figure className="space-y-2">
      <figcaption className="text-sm text-grey-600">Readings of the last 30 days, °{unit}; the dashed line is the heat caution at {heatLine} °{unit}.</figcaption>
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 12, bottom: 4, left: -12 }}>
            <CartesianGrid stroke="#e7e2d8" strokeDasharray="3 3" />
            <XAxis dataKey="at" type="number" scale="time" domain={['dataMin', 'dataMax']} tickFormatter={(v: number) => day.format(new Date(v))} tick={{ fontSize: 12 }} />
            <YAxis tick={{ fontSize: 12 }} domain={['auto', 'auto']} />
            <Tooltip labelFormatter={(v) => new Date(Number(v)).toLocaleString()} formatter={(v) => [`${String(v)} °${unit}`, 'Reading']} />
            <ReferenceLine y={heatLine} stroke="#b5523b" strokeDasharray="6 4" />
            <Line type="monotone" dataKey="value" stroke="#4f6b3a" strokeWidth={2} dot={{ r: 3 }} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
