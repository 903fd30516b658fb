import type { MultiLineString, Polygon, Position } from 'geojson';
import { EARTH_RADIUS_KM, lonLatToWorldUnit, WORLD_PX } from './geo';
import type { Shape } from './atlas';

/**
 * How far apart the two sources may put one land border. The world layer and the
 * US layer were generalised separately, and along the Mexican and Canadian land borders
 * their lines drift up to about 2 km apart; wider gaps are water (the lakes the border
 * crosses), which must stay water.
 */
export const LAND_BORDER_REACH_KM = 2.5;

/** Kilometres covered by one zoom-0 world pixel at a latitude (Mercator scale). */
export function kmPerWorldPx(latDeg: number): number {
  return (2 * Math.PI * EARTH_RADIUS_KM * Math.cos((latDeg * Math.PI) / 180)) / WORLD_PX;
}

type Segment = [number, number, number, number];

function distanceToSegment(px: number, py: number, [ax, ay, bx, by]: Segment): number {
  const dx = bx - ax;
  const dy = by - ay;
  const lengthSq = dx * dx + dy * dy;
  const t = lengthSq === 0 ? 0 : Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / lengthSq));
  return Math.hypot(ax + t * dx - px, ay + t * dy - py);
}

/** Segments of the outline bucketed in a grid so each query reads only nearby cells. */
class SegmentGrid {
  private readonly cells = new Map<string, Segment[]>();
  constructor(private readonly cellSize: number) {}

  add(segment: Segment): void {
    const [ax, ay, bx, by] = segment;
    const c = this.cellSize;
    for (let gx = Math.floor(Math.min(ax, bx) / c); gx <= Math.floor(Math.max(ax, bx) / c); gx++) {
      for (let gy = Math.floor(Math.min(ay, by) / c); gy <= Math.floor(Math.max(ay, by) / c); gy++) {
        const key = `${gx},${gy}`;
        const list = this.cells.get(key);
        if (list) list.push(segment);
        else this.cells.set(key, [segment]);
      }
    }
  }

  /** Is any segment within `reach` of the point? `reach` must not exceed the cell size. */
  near(px: number, py: number, reach: number): boolean {
    const gx = Math.floor(px / this.cellSize);
    const gy = Math.floor(py / this.cellSize);
    for (let dx = -1; dx <= 1; dx++) {
      for (let dy = -1; dy <= 1; dy++) {
        for (const segment of this.cells.get(`${gx + dx},${gy + dy}`) ?? []) {
          if (distanceToSegment(px, py, segment) <= reach) return true;
        }
      }
    }
    return false;
  }
}

/**
 * The stretches of the world layer's US border that run over land: those whose points
 * lie within LAND_BORDER_REACH_KM of the US layer's own outline. Stretches out in the
 * Great Lakes are far from any US shore and are left out.
 */
export function landBorderRuns(border: MultiLineString, usOutline: Shape<Polygon>[]): MultiLineString {
  const maxReach = LAND_BORDER_REACH_KM / kmPerWorldPx(60); // widest reach in world px within the US latitudes
  const grid = new SegmentGrid(maxReach);
  for (const { geometry } of usOutline) {
    for (const ring of geometry.coordinates) {
      for (let i = 1; i < ring.length; i++) grid.add([ring[i - 1][0], ring[i - 1][1], ring[i][0], ring[i][1]]);
    }
  }

  const runs: Position[][] = [];
  for (const line of border.coordinates) {
    let run: Position[] = [];
    for (const [lon, lat] of line) {
      const [ux, uy] = lonLatToWorldUnit(lon, lat);
      if (grid.near(ux * WORLD_PX, uy * WORLD_PX, LAND_BORDER_REACH_KM / kmPerWorldPx(lat))) {
        run.push([lon, lat]);
      } else {
        if (run.length >= 2) runs.push(run);
        run = [];
      }
    }
    if (run.length >= 2) runs.push(run);
  }
  return { type: 'MultiLineString', coordinates: runs };
}
