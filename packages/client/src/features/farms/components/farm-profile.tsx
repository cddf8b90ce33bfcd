import type { FarmDto } from '@burrowline/shared';
import { Card } from '../../../components/ui/card';
import { FarmPhoto } from '../../photos';
import { FarmFacts } from './farm-facts';
import { MemberList } from './member-list';

export function FarmProfile({ farm }: { farm: FarmDto }) {
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <Card className="space-y-6 lg:col-span-2">
        <FarmFacts farm={farm} detailed />
        <section aria-labelledby="about-farm-heading" className="space-y-2">
          <h2 id="about-farm-heading" className="text-sm font-medium text-grey-600">
            About the farm
          </h2>
          {farm.description ? (
            <p className="whitespace-pre-line">{farm.description}</p>
          ) : (
            <p className="text-grey-600">Nothing written yet.</p>
          )}
        </section>
      </Card>
      <div className="space-y-6 self-start">
        <FarmPhoto farmId={farm.id} farmName={farm.name} />
        <Card className="space-y-3">
          <h2 className="text-lg font-semibold">Members</h2>
          <MemberList members={farm.members} />
        </Card>
      </div>
    </div>
  );
}
