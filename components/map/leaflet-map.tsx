"use client";

import "leaflet/dist/leaflet.css";
import "./map.css";
import L, { type LatLngBoundsExpression, type LatLngExpression } from "leaflet";
import type { MultiPolygon, Polygon as GeoPolygon, Position } from "geojson";
import { useMemo, useState } from "react";
import { CircleMarker, MapContainer, Marker, Polygon, TileLayer, Tooltip, useMapEvents } from "react-leaflet";
import { BANDS, type MapBand } from "./bands";

export interface MapField {
  id: string;
  name: string;
  boundary: GeoPolygon | MultiPolygon | null;
  centroid: [number, number] | null;
  band: MapBand;
  /** "32 mm · 2 days" */
  label: string;
}

export interface MapPoint {
  id: string;
  kind: "gauge" | "station";
  name: string;
  position: [number, number];
  /** "4 mm on Tue 1 Dec" */
  lastReading: string;
}

/** Fields are labelled all the time only when the labels have room (common practice, no source). */
const LABEL_ZOOM = 15;
const LABEL_ALL_BELOW_FIELDS = 60;

const ring = (r: Position[]): LatLngExpression[] => r.map((p) => [p[1]!, p[0]!] as [number, number]);

function positionsOf(b: GeoPolygon | MultiPolygon): LatLngExpression[][] | LatLngExpression[][][] {
  return b.type === "Polygon" ? b.coordinates.map(ring) : b.coordinates.map((poly) => poly.map(ring));
}

function boundsOf(fields: readonly MapField[], points: readonly MapPoint[]): LatLngBoundsExpression | null {
  let s = 90, w = 180, n = -90, e = -180;
  const add = (lat: number, lon: number) => {
    s = Math.min(s, lat); n = Math.max(n, lat); w = Math.min(w, lon); e = Math.max(e, lon);
  };
  for (const f of fields) {
    if (f.boundary) {
      const polys = f.boundary.type === "Polygon" ? [f.boundary.coordinates] : f.boundary.coordinates;
      for (const poly of polys) for (const p of poly[0] ?? []) add(p[1]!, p[0]!);
    } else if (f.centroid) add(f.centroid[0], f.centroid[1]);
  }
  for (const p of points) add(p.position[0], p.position[1]);
  return s <= n ? [[s, w], [n, e]] : null;
}

const GLYPHS = {
  gauge: '<svg viewBox="0 0 24 24" width="28" height="28" aria-hidden="true"><circle cx="12" cy="12" r="11" fill="#0f3340" stroke="#fff" stroke-width="2"/><path d="M12 5c-2.4 3.2-4 5.3-4 7a4 4 0 0 0 8 0c0-1.7-1.6-3.8-4-7Z" fill="#eef6f8"/></svg>',
  station: '<svg viewBox="0 0 24 24" width="28" height="28" aria-hidden="true"><rect x="1" y="1" width="22" height="22" rx="6" fill="#44592d" stroke="#fff" stroke-width="2"/><path d="M12 6v12M8 9h8M9 18h6" stroke="#fff" stroke-width="2" stroke-linecap="round"/></svg>',
};

const icons = { gauge: L.divIcon({ html: GLYPHS.gauge, className: "rb-marker", iconSize: [28, 28], iconAnchor: [14, 14] }), station: L.divIcon({ html: GLYPHS.station, className: "rb-marker", iconSize: [28, 28], iconAnchor: [14, 14] }) };

function ZoomWatcher({ onZoom }: { onZoom: (z: number) => void }) {
  useMapEvents({ zoomend: (e) => onZoom(e.target.getZoom()) });
  return null;
}

/** The farm map itself: fields coloured by band and labelled, gauges and stations with their last reading. */
export function LeafletMap({
  fields,
  points,
  tileUrl,
  onOpenField,
}: {
  fields: readonly MapField[];
  points: readonly MapPoint[];
  tileUrl: string | null;
  onOpenField: (id: string) => void;
}) {
  const bounds = useMemo(() => boundsOf(fields, points), [fields, points]);
  const [zoom, setZoom] = useState(0);
  const allLabels = fields.length <= LABEL_ALL_BELOW_FIELDS || zoom >= LABEL_ZOOM;
  return (
    <MapContainer
      {...(bounds ? { bounds, boundsOptions: { padding: [24, 24] } } : { center: [0, 0] as LatLngExpression, zoom: 2 })}
      className="rb-map h-full w-full"
      attributionControl={false}
      zoomSnap={0.25}
    >
      <ZoomWatcher onZoom={setZoom} />
      {tileUrl && <TileLayer url={tileUrl} maxZoom={19} />}
      {fields.map((f) => {
        const band = BANDS[f.band];
        const handlers = { click: () => onOpenField(f.id) };
        const tip = (
          <Tooltip key={allLabels ? "p" : "h"} permanent={allLabels} direction="center" className="rb-field-label" opacity={1}>
            <span className="font-bold">{f.name}</span>
            <br />
            {f.label}
          </Tooltip>
        );
        const style = { color: "#17261f", weight: 1.5, fillColor: band.fill, fillOpacity: 0.85 };
        // Leaflet sets a path's class only when it is created, so it goes in as a prop, not in pathOptions.
        const className = `rb-field rb-band-${f.band}`;
        if (f.boundary) {
          return (
            <Polygon key={`${f.id}-${f.band}`} positions={positionsOf(f.boundary)} className={className} pathOptions={style} eventHandlers={handlers}>
              {tip}
            </Polygon>
          );
        }
        return f.centroid ? (
          <CircleMarker key={`${f.id}-${f.band}`} center={f.centroid} radius={12} className={className} pathOptions={style} eventHandlers={handlers}>
            {tip}
          </CircleMarker>
        ) : null;
      })}
      {points.map((p) => (
        <Marker key={p.id} position={p.position} icon={icons[p.kind]} title={`${p.kind === "gauge" ? "Rain gauge" : "Weather station"} ${p.name}: ${p.lastReading}`}>
          <Tooltip direction="top" offset={[0, -14]}>
            <span className="font-bold">{p.name}</span>
            <br />
            {p.lastReading}
          </Tooltip>
        </Marker>
      ))}
    </MapContainer>
  );
}
