// The map in its own chunk (the map library is large): the first page never loads it.
import { lazy, Suspense } from 'react';
import type { SiteMapProps } from './site-map';
import { Spinner } from '../ui';

const SiteMapChunk = lazy(async () => ({ default: (await import('./site-map')).SiteMap }));

export type { MapPoint, MapSite, SiteMapProps } from './site-map';

export function LazySiteMap(props: SiteMapProps) {
  return (
    <Suspense fallback={<Spinner />}>
      <SiteMapChunk {...props} />
    </Suspense>
  );
}
