import type { LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { farmDetailQueryOptions } from '../../features/farms/api/get-farm';
import { FarmProfileEditor } from '../../features/farms/components/farm-profile-editor';
import { farmIdFrom, useFarmIdParam } from './farm-id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(farmDetailQueryOptions(farmIdFrom(params)));
  return null;
}

export function FarmEditPage() {
  const farmId = useFarmIdParam();
  // A fresh editor per farm: its starting version must never carry over from another farm.
  return <FarmProfileEditor key={farmId} farmId={farmId} />;
}
