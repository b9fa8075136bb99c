// What MapLibre cannot draw: its sources are cut into Web Mercator tiles, on the globe too, so
// an observation or a stretch of track poleward of 85.05 degrees would be pinned to the tile
// edge. This overlay draws those on a 2D canvas over the map, projected by the map itself
// (which is exact up to the pole on the globe), after every frame the map renders. In Mercator
// those positions lie beyond the projection and are not drawn at all.
import type { Map as MapLibreMap } from 'maplibre-gl';
import type { Position } from 'geojson';
import type { PolarParts } from './trackLevels';
import type { MapTheme, Palette } from './style';
import { bandSymbol, drawBandSymbol } from './bandSymbols';
import type { BandKey } from './concentrationBands';

export interface PolarPoint {
  id: string;
  lon: number;
  lat: number;
  band: BandKey;
  t: number;
  observerId: string;
}

/** Hit radius for clicks, in CSS pixels. */
const HIT_PX = 10;

export class PolarOverlay {
  private canvas: HTMLCanvasElement;
  private points: PolarPoint[] = [];
  private parts: PolarParts = { track: [], miz: [] };
  private selected: string | null = null;
  private visible: (p: PolarPoint) => boolean = () => true;
  private enabled = true;
  private ship: { lon: number; lat: number; heading: number } | null = null;
  private readonly draw = () => this.render();

  constructor(private readonly map: MapLibreMap, private palette: Palette, private theme: MapTheme) {
    this.canvas = document.createElement('canvas');
    this.canvas.className = 'map-polar-overlay';
    this.canvas.setAttribute('aria-hidden', 'true');
    this.canvas.style.cssText = 'position:absolute;left:0;top:0;pointer-events:none;';
    map.getCanvasContainer().appendChild(this.canvas);
    map.on('render', this.draw);
  }

  setPoints(points: PolarPoint[]): void {
    this.points = points;
    this.map.triggerRepaint();
  }

  setParts(parts: PolarParts): void {
    this.parts = parts;
    this.map.triggerRepaint();
  }

  /** The ship, when it is poleward of the Mercator limit (else null: the map's layer draws it). */
  setShip(ship: { lon: number; lat: number; heading: number } | null): void {
    this.ship = ship;
    this.map.triggerRepaint();
  }

  setSelected(id: string | null): void {
    this.selected = id;
    this.map.triggerRepaint();
  }

  setFilter(visible: (p: PolarPoint) => boolean): void {
    this.visible = visible;
    this.map.triggerRepaint();
  }

  setPalette(palette: Palette, theme: MapTheme): void {
    this.palette = palette;
    this.theme = theme;
    this.map.triggerRepaint();
  }

  /** Only the globe reaches the poles. */
  setEnabled(enabled: boolean): void {
    this.enabled = enabled;
    this.map.triggerRepaint();
  }

  /** The id of the overlay observation under a screen point, if any. */
  hit(x: number, y: number): string | null {
    if (!this.enabled) return null;
    let best: string | null = null;
    let bestD = HIT_PX;
    for (const p of this.points) {
      if (!this.visible(p) || !this.facing(p.lon, p.lat)) continue;
      const s = this.map.project([p.lon, p.lat]);
      const d = Math.hypot(s.x - x, s.y - y);
      if (d <= bestD) {
        bestD = d;
        best = p.id;
      }
    }
    return best;
  }

  /** Whether a position is on the near side of the globe (the far side is hidden by the globe itself). */
  private facing(lon: number, lat: number): boolean {
    const c = this.map.getCenter();
    const r = Math.PI / 180;
    const cos = Math.sin(lat * r) * Math.sin(c.lat * r) + Math.cos(lat * r) * Math.cos(c.lat * r) * Math.cos((lon - c.lng) * r);
    return cos > 0.1;
  }

  private blank = false;

  private render(): void {
    const empty = !this.enabled || (this.points.length === 0 && this.parts.track.length === 0 && this.parts.miz.length === 0 && !this.ship);
    // Nothing to draw (the usual case away from the poles): clear once, then skip each frame.
    if (empty && this.blank) return;
    this.blank = empty;
    const el = this.map.getCanvas();
    const w = el.clientWidth;
    const h = el.clientHeight;
    const dpr = window.devicePixelRatio || 1;
    if (this.canvas.width !== Math.round(w * dpr) || this.canvas.height !== Math.round(h * dpr)) {
      this.canvas.width = Math.round(w * dpr);
      this.canvas.height = Math.round(h * dpr);
      this.canvas.style.width = `${w}px`;
      this.canvas.style.height = `${h}px`;
    }
    const ctx = this.canvas.getContext('2d');
    if (!ctx) return;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, w, h);
    if (!this.enabled) return;
    const zoom = this.map.getZoom();
    const line = (lines: Position[][], colour: string, width: number, alpha: number) => {
      ctx.globalAlpha = alpha;
      ctx.strokeStyle = colour;
      ctx.lineWidth = width;
      ctx.lineJoin = 'round';
      ctx.lineCap = 'round';
      for (const l of lines) {
        ctx.beginPath();
        l.forEach((p, i) => {
          const s = this.map.project([p[0] as number, p[1] as number]);
          if (i === 0) ctx.moveTo(s.x, s.y);
          else ctx.lineTo(s.x, s.y);
        });
        ctx.stroke();
      }
      ctx.globalAlpha = 1;
    };
    line(this.parts.miz, this.palette.miz, 9, 0.5);
    line(this.parts.track, this.palette.track, 1.6, 1);
    if (this.ship && this.facing(this.ship.lon, this.ship.lat)) {
      const s = this.map.project([this.ship.lon, this.ship.lat]);
      ctx.save();
      ctx.translate(s.x, s.y);
      if (this.ship.heading >= 0) {
        // Heading is degrees true: rotate by it plus the screen angle of north at the ship.
        const north = this.map.project([this.ship.lon, Math.min(89.999, this.ship.lat + 0.01)]);
        ctx.rotate(Math.atan2(north.x - s.x, s.y - north.y) + (this.ship.heading * Math.PI) / 180);
        ctx.beginPath();
        ctx.moveTo(0, -12);
        ctx.lineTo(8, 11);
        ctx.lineTo(0, 6);
        ctx.lineTo(-8, 11);
        ctx.closePath();
      } else {
        ctx.beginPath();
        ctx.arc(0, 0, 7, 0, Math.PI * 2);
      }
      ctx.lineWidth = 2.5;
      ctx.strokeStyle = this.palette.ocean;
      ctx.stroke();
      ctx.fillStyle = this.palette.ship;
      ctx.fill();
      ctx.restore();
    }
    // Same sizes as the circle layer (style.ts, the palette's radius at zoom 0, 6 and 10).
    const [r0, r6, r10] = this.palette.radius;
    const base = zoom <= 6 ? r0 + ((r6 - r0) * Math.max(0, zoom)) / 6 : Math.min(r10, r6 + ((zoom - 6) * (r10 - r6)) / 4);
    for (const p of this.points) {
      if (!this.visible(p) || !this.facing(p.lon, p.lat)) continue;
      const s = this.map.project([p.lon, p.lat]);
      const symbol = bandSymbol(this.theme, p.band);
      if (p.id === this.selected) {
        ctx.beginPath();
        ctx.arc(s.x, s.y, base + 4, 0, Math.PI * 2);
        ctx.lineWidth = 3;
        ctx.strokeStyle = this.palette.selected;
        ctx.stroke();
      }
      drawBandSymbol(ctx, this.theme === 'red' ? symbol : { ...symbol, ring: this.palette.stroke }, s.x, s.y, base, this.palette.ocean, 1);
    }
  }

  destroy(): void {
    this.map.off('render', this.draw);
    this.canvas.remove();
  }
}
