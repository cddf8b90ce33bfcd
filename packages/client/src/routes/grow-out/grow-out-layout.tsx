import { BarChart3, HeartPulse, Scale, Sprout, Wheat } from 'lucide-react';
import { Outlet } from 'react-router-dom';
import { SectionTab as Tab, SectionTabs } from '../../components/ui/section-tabs';

/**
 * The grow-out area: groups raised to market weight, the feed bought and given, health
 * (treatments and withdrawal, the barn's temperature), processing records with their yields, and the
 * performance of each doe, buck, breed and cross that keep and cull decisions rest on.
 */
export function GrowOutLayout() {
  return (
    <div className="space-y-6">
      <SectionTabs label="Grow-out">
        <Tab to="/grow-out" end icon={<Sprout className="size-5" aria-hidden="true" />}>
          Groups
        </Tab>
        <Tab to="/grow-out/feed" icon={<Wheat className="size-5" aria-hidden="true" />}>
          Feed
        </Tab>
        <Tab to="/grow-out/health" icon={<HeartPulse className="size-5" aria-hidden="true" />}>
          Health
        </Tab>
        <Tab to="/grow-out/processing" icon={<Scale className="size-5" aria-hidden="true" />}>
          Processing
        </Tab>
        <Tab to="/grow-out/performance" icon={<BarChart3 className="size-5" aria-hidden="true" />}>
          Performance
        </Tab>
      </SectionTabs>
      <Outlet />
    </div>
  );
}
