import { ListTree, Sprout } from 'lucide-react';
import { SectionTab as Tab, SectionTabs } from '../../components/ui/section-tabs';

/** The Herd area's two views: every animal, and the does with where each stands in her cycle. */
export function HerdTabs() {
  return (
    <SectionTabs label="Herd">
      <Tab to="/herd" end icon={<ListTree className="size-5" aria-hidden="true" />}>
        Animals
      </Tab>
      <Tab to="/herd/does" icon={<Sprout className="size-5" aria-hidden="true" />}>
        Doe board
      </Tab>
    </SectionTabs>
  );
}
