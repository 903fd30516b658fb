'use client';

import 'leaflet/dist/leaflet.css';
import L from 'leaflet';
import Link from 'next/link';
import { MapContainer, Marker, Popup, TileLayer } from 'react-leaflet';
import MarkerClusterGroup from 'react-leaflet-cluster';

export interface MapShop {
  slug: string;
  name: string;
  city: string;
  region: string;
  latitude: number;
  longitude: number;
  summary: string;
}

// A drawn marker: no image files, so nothing is fetched from anywhere but this app.
const shopIcon = L.divIcon({
  className: '',
  html: '<span style="display:block;width:18px;height:18px;border-radius:9999px;background:#0f5d5c;border:3px solid #e6c27a;box-shadow:0 1px 3px rgba(0,0,0,.35)"></span>',
  iconSize: [18, 18],
  iconAnchor: [9, 9],
  popupAnchor: [0, -10],
});

function clusterIcon(cluster: { getChildCount(): number }) {
  const n = cluster.getChildCount();
  return L.divIcon({
    className: '',
    html: `<span style="display:flex;align-items:center;justify-content:center;width:34px;height:34px;border-radius:9999px;background:#b98a2e;color:#1b2230;font-weight:700;border:3px solid #fff;box-shadow:0 1px 4px rgba(0,0,0,.35)">${n}</span>`,
    iconSize: [34, 34],
  });
}

export default function BuilderMap({ shops, attribution }: { shops: MapShop[]; attribution: string }) {
  return (
    <MapContainer
      center={[38.5, -96]}
      zoom={4}
      minZoom={3}
      maxZoom={10}
      scrollWheelZoom={false}
      className="h-[460px] w-full rounded-lg border border-chalk-200"
      maxBounds={[
        [10, -180],
        [72, -50],
      ]}
    >
      <TileLayer url="/api/tiles/{z}/{x}/{y}.png" attribution={attribution} minZoom={3} maxZoom={10} />
      <MarkerClusterGroup iconCreateFunction={clusterIcon} showCoverageOnHover={false} maxClusterRadius={40}>
        {shops.map((shop) => (
          <Marker key={shop.slug} position={[shop.latitude, shop.longitude]} icon={shopIcon} title={shop.name}>
            <Popup>
              <div className="space-y-1" data-testid="shop-card">
                <p className="font-display text-base font-bold text-ink-900">{shop.name}</p>
                <p className="text-xs text-ink-500">
                  {shop.city}, {shop.region}
                </p>
                <p className="text-xs text-ink-700">{shop.summary}</p>
                <Link href={`/shops/${shop.slug}`}>See the shop</Link>
              </div>
            </Popup>
          </Marker>
        ))}
      </MarkerClusterGroup>
    </MapContainer>
  );
}
