import { ShieldAlert } from 'lucide-react';

/**
 * Shown once where a buck travels (a loan's page, the request form): the quarantine window the co-op
 * places on the receiving farm's Almanac, and the isolation practice it stands for.
 */
export function BiosecurityCaution({ quarantineDays }: { quarantineDays: number | null }) {
  return (
    <details className="group rounded-xl border-2 border-straw bg-straw-wash/60 px-4 py-2" data-testid="biosecurity-caution">
      <summary className="flex min-h-11 cursor-pointer items-center gap-2 font-semibold">
        <ShieldAlert className="size-5 shrink-0 text-bark" aria-hidden="true" />
        <span>
          Biosecurity: he is isolated {quarantineDays ? `${quarantineDays} days` : 'for the quarantine window'} after each move
        </span>
      </summary>
      <ul className="list-disc space-y-1 pb-2 pl-6 text-sm text-bark">
        <li>
          The co-op places the quarantine on the Almanac of the farm that receives him, after the hand-over and after his return
          (30 days is a common recommendation for RHDV2).
        </li>
        <li>Keep him in a separate cage and air space, away from the herd; tend him last, with his own feeder, water and gloves.</li>
        <li>Ask for his RHDV2 vaccination date and last health check; travel cages are cleaned and disinfected both ways.</li>
        <li>Follow your state's and your veterinarian's advice on movements and vaccination; they come before this note.</li>
      </ul>
    </details>
  );
}
