"use client";

import L from "leaflet";
import "leaflet/dist/leaflet.css";
import "@geoman-io/leaflet-geoman-free";
import "@geoman-io/leaflet-geoman-free/dist/leaflet-geoman.css";
import { useEffect, useRef } from "react";
import type { Boundary } from "@/lib/geo/boundary";
import type { FieldDto } from "@/lib/client/use-farm-setup";

export type MapMode = "view" | "draw" | "edit";

export interface BoundaryMapProps {
  fields: FieldDto[];
  selectedId: string | null;
  mode: MapMode;
  /** where to look when no field has a boundary yet */
  centre: [number, number] | null;
  /** an absolute or local tile URL template; null draws the fields on a plain background */
  tileUrl: string | null;
  /** a drawn outline not yet saved, shown dashed */
  pending: Boundary | null;
  onSelect: (fieldId: string) => void;
  /** the outline drawn or edited, not yet saved */
  onShape: (boundary: Boundary) => void;
}

const STYLE = { color: "#1d5566", weight: 2, fillColor: "#6aa6b5", fillOpacity: 0.25 };
const SELECTED = { color: "#0f3440", weight: 4, fillColor: "#d8c48f", fillOpacity: 0.45 };

function geometryOf(layer: L.Layer): Boundary | null {
  if (!(layer instanceof L.Polygon)) return null;
  const g = layer.toGeoJSON().geometry;
  return g.type === "Polygon" || g.type === "MultiPolygon" ? g : null;
}

/**
 * The farm's fields on a Leaflet map with Geoman's drawing tools. Leaflet touches `window`, so this
 * module is loaded with next/dynamic and ssr: false.
 */
export function BoundaryMap({ fields, selectedId, mode, centre, tileUrl, pending, onSelect, onShape }: BoundaryMapProps) {
  const box = useRef<HTMLDivElement>(null);
  const map = useRef<L.Map | null>(null);
  const layers = useRef<L.FeatureGroup | null>(null);
  const callbacks = useRef({ onSelect, onShape });
  useEffect(() => {
    callbacks.current = { onSelect, onShape };
  });

  useEffect(() => {
    if (!box.current) return;
    const m = L.map(box.current, { zoomControl: true, attributionControl: Boolean(tileUrl) });
    if (tileUrl) L.tileLayer(tileUrl, { maxZoom: 19, attribution: "Map tiles as configured for this farm" }).addTo(m);
    m.setView(centre ?? [0, 0], centre ? 14 : 2);
    m.pm.setGlobalOptions({ snappable: true, allowSelfIntersection: false });
    layers.current = L.featureGroup().addTo(m);
    m.on("pm:create", (e) => {
      const g = geometryOf(e.layer);
      m.removeLayer(e.layer);
      if (g) callbacks.current.onShape(g);
    });
    map.current = m;
    return () => {
      m.remove();
      map.current = null;
    };
  }, [centre, tileUrl]);

  // Redraw the fields when they, the selection or the mode change; keep the view unless it is the first draw.
  useEffect(() => {
    const m = map.current;
    const group = layers.current;
    if (!m || !group) return;
    const first = group.getLayers().length === 0;
    group.clearLayers();
    for (const f of fields) {
      if (!f.boundary) continue;
      const selected = f.id === selectedId;
      L.geoJSON(f.boundary, { style: selected ? SELECTED : STYLE }).eachLayer((layer) => {
        layer.on("click", () => callbacks.current.onSelect(f.id));
        if (layer instanceof L.Path) layer.bindTooltip(`${f.name} · ${f.areaHa.toFixed(2)} ha`, { sticky: true });
        group.addLayer(layer);
        if (selected && mode === "edit" && layer instanceof L.Polygon) {
          layer.pm.enable({ allowSelfIntersection: false });
          layer.on("pm:edit", () => {
            const g = geometryOf(layer);
            if (g) callbacks.current.onShape(g);
          });
        }
      });
    }
    if (first && group.getLayers().length > 0) m.fitBounds(group.getBounds(), { padding: [20, 20] });
  }, [fields, selectedId, mode]);

  // A drawn outline stays visible until it is saved or discarded (corner edits show on the field itself).
  useEffect(() => {
    const m = map.current;
    if (!m || !pending || mode === "edit") return;
    const layer = L.geoJSON(pending, { style: { ...SELECTED, dashArray: "6 6" } }).addTo(m);
    return () => {
      m.removeLayer(layer);
    };
  }, [pending, mode]);

  useEffect(() => {
    const m = map.current;
    if (!m) return;
    if (mode === "draw") m.pm.enableDraw("Polygon", { snappable: true, finishOn: null });
    else m.pm.disableDraw();
  }, [mode]);

  return <div ref={box} className="h-[55vh] min-h-72 w-full rounded-2xl bg-river-50 ring-1 ring-river-100" role="application" aria-label="Field boundaries map" />;
}
