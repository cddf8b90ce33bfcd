import { BookOpen, FileUp, Rabbit, Settings } from 'lucide-react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';

function Step({ to, icon, title, children }: { to: string; icon: ReactNode; title: string; children: string }) {
  return (
    <li>
      <Link to={to} className="flex min-h-14 items-start gap-3 rounded-xl border border-grey-200 p-3 hover:border-moss focus-visible:outline-moss">
        <span className="mt-0.5 text-moss" aria-hidden="true">{icon}</span>
        <span>
          <span className="block font-semibold text-bark">{title}</span>
          <span className="block text-sm text-grey-600">{children}</span>
        </span>
      </Link>
    </li>
  );
}

/** A new farm's first screen: what to do before the Almanac has anything to plan. */
export function FirstSteps() {
  return (
    <Card className="space-y-4" aria-labelledby="first-steps">
      <h2 id="first-steps" className="text-xl font-bold">First steps</h2>
      <p className="text-grey-700">Your herd is empty, so nothing is planned yet. Start here:</p>
      <ol className="grid gap-3 md:grid-cols-2">
        <Step to="/herd/new" icon={<Rabbit className="size-5" />} title="Add your does and bucks">One at a time, with their parents if you know them.</Step>
        <Step to="/herd/import" icon={<FileUp className="size-5" />} title="Or bring in a spreadsheet">Every animal from a CSV file at once, checked row by row.</Step>
        <Step to="/almanac/settings" icon={<Settings className="size-5" />} title="Set your units and breeding cycle">Pounds or kilograms, and the days to palpation, kindling and weaning.</Step>
        <Step to="/co-op" icon={<BookOpen className="size-5" />} title="Read the co-op's rules">What the farms agreed on: quarantine, sharing, fees.</Step>
      </ol>
    </Card>
  );
}
