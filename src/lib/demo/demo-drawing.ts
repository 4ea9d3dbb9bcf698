/**
 * An invented line drawing for the demo programme's calf stretch, so a hand-over with a photo can
 * be shown from the demo: a person facing a wall, hands on it, the back leg straight with its heel
 * down, the front knee bent. Drawn for this project (no copied image). Pure: the page paints it on a
 * canvas and encodes it as WebP (ui/programme/paint-drawing.ts); Node never needs to.
 */
export interface LineDrawing {
  readonly widthPx: number;
  readonly heightPx: number;
  readonly background: string;
  readonly shapes: readonly DrawingShape[];
}

export type DrawingShape =
  | { readonly kind: 'rect'; readonly x: number; readonly y: number; readonly width: number; readonly height: number; readonly fill: string }
  | { readonly kind: 'path'; readonly points: readonly (readonly [number, number])[]; readonly stroke: string; readonly lineWidth: number }
  | { readonly kind: 'circle'; readonly x: number; readonly y: number; readonly radius: number; readonly fill: string };

/** The exercise the drawing shows, by its name in the demo programme. */
export const DEMO_DRAWN_EXERCISE = 'Calf stretch against a wall';

const INK = '#1f2d3d';
const LIMB = 14;

export function calfStretchDrawing(): LineDrawing {
  const floor = 520;
  const wallX = 620;
  const hip: [number, number] = [370, 330];
  const shoulder: [number, number] = [470, 210];
  return {
    widthPx: 800,
    heightPx: 600,
    background: '#f4efe6',
    shapes: [
      { kind: 'rect', x: 0, y: floor, width: 800, height: 80, fill: '#c9b79c' },
      { kind: 'rect', x: wallX, y: 0, width: 180, height: floor, fill: '#9fb7c9' },
      // Back leg: straight from the hip to a heel flat on the floor.
      { kind: 'path', points: [hip, [250, floor - 10], [205, floor - 2]], stroke: INK, lineWidth: LIMB },
      // Front leg: knee bent towards the wall.
      { kind: 'path', points: [hip, [470, 410], [455, floor - 10], [500, floor - 2]], stroke: INK, lineWidth: LIMB },
      // Trunk leaning forward, arms reaching to the wall.
      { kind: 'path', points: [hip, shoulder], stroke: INK, lineWidth: LIMB + 4 },
      { kind: 'path', points: [shoulder, [540, 190], [wallX - 4, 170]], stroke: INK, lineWidth: LIMB - 2 },
      { kind: 'path', points: [shoulder, [545, 225], [wallX - 4, 215]], stroke: INK, lineWidth: LIMB - 2 },
      { kind: 'circle', x: 505, y: 150, radius: 42, fill: INK },
      // Where the stretch is felt: the calf of the straight back leg.
      { kind: 'circle', x: 292, y: 448, radius: 28, fill: 'rgba(200, 60, 40, 0.45)' },
    ],
  };
}
