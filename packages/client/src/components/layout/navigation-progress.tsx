import { useNavigation } from 'react-router-dom';

/** A thin straw bar while a route's data loads; slow barn Wi-Fi should not look like a frozen app. */
export function NavigationProgress() {
  const navigation = useNavigation();
  if (navigation.state === 'idle') return null;
  return (
    <div role="progressbar" aria-label="Loading page" className="fixed inset-x-0 top-0 z-20 h-1 overflow-hidden bg-straw/30">
      <div className="h-full w-1/3 animate-pulse bg-straw" />
    </div>
  );
}
