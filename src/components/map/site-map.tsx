// The project map: worksites with their shore-normal arrows, the offshore data point with the
// forecast's mean wave direction, on a coastline that ships with the app (Natural Earth land, public
// domain, from world-atlas through topojson-client, served from our own origin: no network outside
// the app). A production tile style replaces it when the server sets MAP_STYLE_URL.
// This module is heavy (the map library): load it through ./lazy-site-map.tsx only.
import { useEffect, useRef } from 'react';
import {
  AttributionControl,
  LngLatBounds,
  Map as MapView,
  Marker,
  NavigationControl,
  setWorkerUrl,
  type StyleSpecification,
} from 'maplibre-gl';
// The map library draws in a worker it loads from beside its own module; the bundle moves the
// module, so the worker file is shipped as an asset of ours and named here.
import workerUrl from 'maplibre-gl/dist/maplibre-gl-worker.mjs?url';
import 'maplibre-gl/dist/maplibre-gl.css';
import { feature } from 'topojson-client';
import type { Topology, GeometryCollection } from 'topojson-specification';
import landUrl from 'world-atlas/land-50m.json?url';

export interface MapSite {
  id: string;
  name: string;
  latitude: number;
  longitude: number;
  /** Shore-normal bearing, degrees "coming from" (waves crossing the contours head-on come from here); null = none. */
  shoreNormal: number | null;
}

export interface MapPoint {
  name: string;
  latitude: number;
  longitude: number;
}

export interface SiteMapProps {
  sites: MapSite[];
  dataPoint: MapPoint | null;
  /** Mean wave direction of the current forecast at the data point, degrees "coming from"; null = none. */
  waveDirection: number | null;
  /** The database tide station a worksite's tide is predicted from (docs/domain.md#tide); null = none. */
  tideStation?: MapPoint | null;
  /** Called with a clicked position (degrees north, east); set: the map is in "click to set a position" mode. */
  onPick?: (latitude: number, longitude: number) => void;
  /** The site being placed (its marker is highlighted). */
  pickSiteId?: string | null;
  styleUrl?: string | null;
  attribution?: string | null;
  /** Accessible name of the map. */
  label: string;
  className?: string;
}

setWorkerUrl(workerUrl);

const SEA = '#d7e7ea';
const LAND = '#e9e4d4';
const COAST = '#8a9a8e';

let landCache: Promise<GeoJSON.FeatureCollection | GeoJSON.Feature> | null = null;
/** Natural Earth land at 1:50m, read once from the app's own origin. */
function loadLand() {
  landCache ??= fetch(landUrl)
    .then((r) => {
      if (!r.ok) throw new Error(`The coastline file answered ${r.status}`);
      return r.json() as Promise<Topology<{ land: GeometryCollection }>>;
    })
    .then((topo) => feature(topo, topo.objects.land));
  return landCache;
}

function builtInStyle(land: GeoJSON.FeatureCollection | GeoJSON.Feature): StyleSpecification {
  return {
    version: 8,
    sources: { land: { type: 'geojson', data: land, attribution: 'Coastline: Natural Earth (public domain)' } },
    layers: [
      { id: 'sea', type: 'background', paint: { 'background-color': SEA } },
      { id: 'land', type: 'fill', source: 'land', paint: { 'fill-color': LAND, 'fill-outline-color': COAST } },
    ],
  };
}

/** An arrow (SVG) pointing at `bearing` degrees clockwise from north. */
function arrow(bearing: number, colour: string, lengthPx: number, title: string): SVGSVGElement {
  const ns = 'http://www.w3.org/2000/svg';
  const svg = document.createElementNS(ns, 'svg');
  const size = lengthPx * 2;
  svg.setAttribute('width', String(size));
  svg.setAttribute('height', String(size));
  svg.setAttribute('viewBox', `${-lengthPx} ${-lengthPx} ${size} ${size}`);
  svg.style.position = 'absolute';
  svg.style.left = '50%';
  svg.style.top = '50%';
  svg.style.transform = `translate(-50%, -50%) rotate(${bearing}deg)`;
  svg.style.pointerEvents = 'none';
  svg.style.overflow = 'visible';
  const t = document.createElementNS(ns, 'title');
  t.textContent = title;
  const line = document.createElementNS(ns, 'path');
  const tip = -lengthPx + 2;
  line.setAttribute('d', `M0 0 L0 ${tip} M-5 ${tip + 7} L0 ${tip} L5 ${tip + 7}`);
  line.setAttribute('stroke', colour);
  line.setAttribute('stroke-width', '2.5');
  line.setAttribute('fill', 'none');
  line.setAttribute('stroke-linecap', 'round');
  svg.append(t, line);
  return svg;
}

/**
 * A marker's element, `sizePx` square: its arrow (when there is one) under the shape, drawn by
 * `shapeCss`, and the name beside it; named for screen readers by `label`.
 */
function markerElement(m: { testid: string; label: string; sizePx: number; arrow: SVGSVGElement | null; shapeCss: string; name: string }) {
  const el = document.createElement('div');
  el.dataset.testid = m.testid;
  el.setAttribute('role', 'img');
  el.setAttribute('aria-label', m.label);
  el.style.position = 'relative';
  el.style.width = `${m.sizePx}px`;
  el.style.height = `${m.sizePx}px`;
  if (m.arrow) el.append(m.arrow);
  const shape = document.createElement('div');
  shape.style.cssText = `position:absolute;inset:0;${m.shapeCss};border:2px solid #fff;box-shadow:0 0 0 1px #0e2a3b`;
  el.append(shape);
  const name = document.createElement('div');
  name.textContent = m.name;
  name.style.cssText = `position:absolute;left:${m.sizePx + 4}px;top:-2px;white-space:nowrap;font-size:12px;font-weight:600;color:#0e2a3b;text-shadow:0 0 3px #fff,0 0 3px #fff`;
  el.append(name);
  return el;
}

function siteMarker(site: MapSite, highlighted: boolean): HTMLElement {
  const el = markerElement({
    testid: 'map-site-marker',
    label: `Worksite ${site.name}${site.shoreNormal !== null ? `, shore normal ${Math.round(site.shoreNormal)}°` : ''}`,
    sizePx: 18,
    // The shore normal is a "coming from" bearing: the arrow points from the worksite out to sea along it.
    arrow: site.shoreNormal !== null ? arrow(site.shoreNormal, '#0b7a72', 34, `Shore normal ${Math.round(site.shoreNormal)}°`) : null,
    shapeCss: `border-radius:50%;background:${highlighted ? '#f2c46d' : '#0e2a3b'}`,
    name: site.name,
  });
  el.dataset.siteId = site.id;
  return el;
}

function pointMarker(p: MapPoint, kind: 'data-point' | 'tide-station', waveDirection: number | null): HTMLElement {
  const what = kind === 'data-point' ? 'Offshore data point' : 'Tide station';
  return markerElement({
    testid: kind === 'data-point' ? 'map-data-point' : 'map-tide-station',
    label: `${what} ${p.name}${waveDirection !== null ? `, mean wave direction ${Math.round(waveDirection)}° (coming from)` : ''}`,
    sizePx: 16,
    // Waves "coming from" d travel towards d + 180°: the arrow shows the way they go.
    arrow:
      waveDirection !== null
        ? arrow((waveDirection + 180) % 360, '#b4233c', 40, `Mean wave direction ${Math.round(waveDirection)}° (coming from)`)
        : null,
    shapeCss: `transform:rotate(45deg);background:${kind === 'data-point' ? '#b4233c' : '#16415a'}`,
    name: p.name,
  });
}

export function SiteMap({
  sites,
  dataPoint,
  waveDirection,
  tideStation = null,
  onPick,
  pickSiteId = null,
  styleUrl,
  attribution,
  label,
  className = '',
}: SiteMapProps) {
  const box = useRef<HTMLDivElement>(null);
  const map = useRef<MapView | null>(null);
  const pick = useRef(onPick);
  const fitted = useRef(false);
  useEffect(() => {
    pick.current = onPick;
  }, [onPick]);

  // The map itself: made once per style.
  useEffect(() => {
    const container = box.current;
    if (!container) return;
    let cancelled = false;
    let made: MapView | null = null;
    void (async () => {
      const style = styleUrl ? styleUrl : builtInStyle(await loadLand());
      if (cancelled) return;
      made = new MapView({
        container,
        style,
        center: [0, 20],
        zoom: 1,
        attributionControl: false,
        dragRotate: false,
        pitchWithRotate: false,
      });
      made.addControl(new AttributionControl({ compact: true, customAttribution: styleUrl && attribution ? attribution : undefined }));
      made.addControl(new NavigationControl({ showCompass: false }), 'top-right');
      made.on('click', (e) => pick.current?.(Math.round(e.lngLat.lat * 1e5) / 1e5, Math.round(e.lngLat.lng * 1e5) / 1e5));
      map.current = made;
      fitted.current = false;
      container.dispatchEvent(new CustomEvent('lullwatch-map-ready'));
    })();
    return () => {
      cancelled = true;
      made?.remove();
      map.current = null;
    };
  }, [styleUrl, attribution]);

  // Markers and the view: redrawn when the data changes.
  useEffect(() => {
    const markers: Marker[] = [];
    const draw = () => {
      const m = map.current;
      if (!m) return;
      for (const s of sites)
        markers.push(new Marker({ element: siteMarker(s, s.id === pickSiteId) }).setLngLat([s.longitude, s.latitude]).addTo(m));
      if (dataPoint)
        markers.push(
          new Marker({ element: pointMarker(dataPoint, 'data-point', waveDirection) })
            .setLngLat([dataPoint.longitude, dataPoint.latitude])
            .addTo(m),
        );
      if (tideStation)
        markers.push(
          new Marker({ element: pointMarker(tideStation, 'tide-station', null) })
            .setLngLat([tideStation.longitude, tideStation.latitude])
            .addTo(m),
        );
      const points = [
        ...sites.map((s) => [s.longitude, s.latitude] as [number, number]),
        ...(dataPoint ? [[dataPoint.longitude, dataPoint.latitude] as [number, number]] : []),
      ];
      // Fitted once per map: a click that moves a worksite does not move the view under the pointer.
      if (points.length > 0 && !fitted.current) {
        fitted.current = true;
        const bounds = points.reduce((b, p) => b.extend(p), new LngLatBounds(points[0], points[0]));
        m.fitBounds(bounds, { padding: 48, maxZoom: 11, duration: 0 });
      }
    };
    const container = box.current;
    if (map.current) draw();
    else container?.addEventListener('lullwatch-map-ready', draw, { once: true });
    return () => {
      container?.removeEventListener('lullwatch-map-ready', draw);
      for (const mk of markers) mk.remove();
    };
  }, [sites, dataPoint, waveDirection, tideStation, pickSiteId]);

  return (
    <div
      ref={box}
      role="region"
      aria-label={label}
      data-testid="site-map"
      className={`relative h-72 w-full overflow-hidden rounded-lg border border-line sm:h-96 ${onPick ? 'cursor-crosshair' : ''} ${className}`}
    />
  );
}
