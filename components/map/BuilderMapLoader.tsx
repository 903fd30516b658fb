'use client';

import dynamic from 'next/dynamic';
import { Spinner } from '@/components/ui/Spinner';
import type { MapShop } from './BuilderMap';

// Leaflet touches window and is heavy: load it only in the browser, only on pages that show a map.
const BuilderMap = dynamic(() => import('./BuilderMap'), { ssr: false, loading: () => <Spinner label="Loading the map…" /> });

export function BuilderMapLoader(props: { shops: MapShop[]; attribution: string }) {
  return <BuilderMap {...props} />;
}
