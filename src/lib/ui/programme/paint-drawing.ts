import type { LineDrawing } from '$lib/demo';
import { MAX_PHOTO_BYTES, sniffPhotoType, type PhotoType } from '$lib/domain';

/**
 * Paints a line drawing on a canvas and encodes it as WebP (JPEG where the browser cannot write
 * WebP, told by the bytes, as shrink-photo does). Returns null where no canvas can encode (then the
 * demo simply has no photo) or the result would break the photo size limit.
 */
export async function paintDrawing(drawing: LineDrawing): Promise<{ type: PhotoType; widthPx: number; heightPx: number; bytes: Uint8Array } | null> {
  if (typeof OffscreenCanvas !== 'function') return null;
  const canvas = new OffscreenCanvas(drawing.widthPx, drawing.heightPx);
  const g = canvas.getContext('2d');
  if (!g) return null;
  g.fillStyle = drawing.background;
  g.fillRect(0, 0, drawing.widthPx, drawing.heightPx);
  g.lineCap = 'round';
  g.lineJoin = 'round';
  for (const shape of drawing.shapes) {
    if (shape.kind === 'rect') {
      g.fillStyle = shape.fill;
      g.fillRect(shape.x, shape.y, shape.width, shape.height);
    } else if (shape.kind === 'circle') {
      g.fillStyle = shape.fill;
      g.beginPath();
      g.arc(shape.x, shape.y, shape.radius, 0, 2 * Math.PI);
      g.fill();
    } else {
      g.strokeStyle = shape.stroke;
      g.lineWidth = shape.lineWidth;
      g.beginPath();
      shape.points.forEach(([x, y], i) => (i === 0 ? g.moveTo(x, y) : g.lineTo(x, y)));
      g.stroke();
    }
  }
  for (const type of ['image/webp', 'image/jpeg'] as const) {
    const bytes = new Uint8Array(await (await canvas.convertToBlob({ type, quality: 0.82 })).arrayBuffer());
    if (sniffPhotoType(bytes) === type && bytes.length <= MAX_PHOTO_BYTES) return { type, widthPx: drawing.widthPx, heightPx: drawing.heightPx, bytes };
  }
  return null;
}
