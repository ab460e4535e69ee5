/**
 * A pinhole camera looking at the cutting mat (the plane z = 0, inches), written from first
 * principles so that photo measurements can be checked against known geometry.
 */
export type Point = [number, number];

export interface Camera {
  /** tilt away from looking straight down, degrees (about the mat's x axis) */
  tilt: number;
  /** turn about the viewing axis, degrees */
  roll: number;
  /** focal length in pixels */
  focal: number;
  /** distance from the camera to the mat along the view axis, inches */
  distance: number;
  /** the mat point the camera looks at */
  target: Point;
  /** image centre in pixels */
  centre: Point;
}

export function project(camera: Camera, [X, Y]: Point): Point {
  const t = (camera.tilt * Math.PI) / 180;
  const r = (camera.roll * Math.PI) / 180;
  const x0 = X - camera.target[0];
  const y0 = Y - camera.target[1];
  // Tilt about the x axis, then place the mat `distance` in front of the camera.
  const y1 = y0 * Math.cos(t);
  const z1 = camera.distance + y0 * Math.sin(t);
  const x2 = x0 * Math.cos(r) - y1 * Math.sin(r);
  const y2 = x0 * Math.sin(r) + y1 * Math.cos(r);
  return [camera.centre[0] + (camera.focal * x2) / z1, camera.centre[1] + (camera.focal * y2) / z1];
}

/** Corners of a w × h rectangle at (x, y) turned by `angle` degrees about its top-left corner. */
export function rectangle(x: number, y: number, w: number, h: number, angle = 0): [Point, Point, Point, Point] {
  const a = (angle * Math.PI) / 180;
  const at = (u: number, v: number): Point => [x + u * Math.cos(a) - v * Math.sin(a), y + u * Math.sin(a) + v * Math.cos(a)];
  return [at(0, 0), at(w, 0), at(w, h), at(0, h)];
}
