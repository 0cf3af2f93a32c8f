// Zoom, fit and canvas-size arithmetic. Pure, so it is unit tested without a browser.

/** CSS px per PDF point: 96 px per inch (CSS) over 72 pt per inch (PDF user space). */
export const CSS_PX_PER_PT = 96 / 72;

/** Canvas area cap, device pixels: 4096 × 4096 = 2^24 ≈ 16.7 MP. */
export const MAX_CANVAS_PIXELS = 2 ** 24;

/** Canvas side cap, device pixels: Chromium refuses larger canvases. */
export const MAX_CANVAS_SIDE = 32_767;

/** Neighbours are pre-rendered only while one costs at most this many device pixels (~32 MB). */
export const NEIGHBOUR_PIXEL_BUDGET = 8 * 2 ** 20;

/** Zoom 1 shows the sheet at its printed size on a 96 dpi CSS screen. */
export const ZOOM_STEPS = [0.1, 0.15, 0.25, 0.33, 0.5, 0.67, 0.75, 1, 1.25, 1.5, 2, 3, 4] as const;
export const MIN_ZOOM = ZOOM_STEPS[0];
export const MAX_ZOOM = ZOOM_STEPS[ZOOM_STEPS.length - 1] ?? 4;

/** Space around the sheet inside the view, CSS px, each side: a 16 px margin and the 1 px sheet edge. */
export const STAGE_PADDING = 17;

export type ZoomSpec = { mode: "fit-width" } | { mode: "fit-page" } | { mode: "zoom"; zoom: number };

export interface Size {
  width: number;
  height: number;
}

export function clampZoom(zoom: number): number {
  if (!Number.isFinite(zoom)) return 1;
  return Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, zoom));
}

/** page: size at scale 1 in PDF points (after the page's own rotation); box: view size in CSS px. */
export function resolveZoom(spec: ZoomSpec, page: Size, box: Size, padding = STAGE_PADDING): number {
  if (spec.mode === "zoom") return clampZoom(spec.zoom);
  if (page.width <= 0 || page.height <= 0) return 1;
  const availW = Math.max(1, box.width - 2 * padding);
  const availH = Math.max(1, box.height - 2 * padding);
  const byWidth = availW / (page.width * CSS_PX_PER_PT);
  if (spec.mode === "fit-width") return clampZoom(byWidth);
  return clampZoom(Math.min(byWidth, availH / (page.height * CSS_PX_PER_PT)));
}

/** On-screen size of the sheet, CSS px. */
export function cssSize(page: Size, zoom: number): Size {
  return { width: page.width * CSS_PX_PER_PT * zoom, height: page.height * CSS_PX_PER_PT * zoom };
}

/**
 * Device pixels per CSS px for the canvas: the screen's ratio, lowered so that the canvas
 * stays within maxPixels and maxSide. Above the cap the sheet is drawn a little soft.
 */
export function outputScale(css: Size, devicePixelRatio: number, maxPixels = MAX_CANVAS_PIXELS, maxSide = MAX_CANVAS_SIDE): number {
  const dpr = Number.isFinite(devicePixelRatio) && devicePixelRatio > 0 ? devicePixelRatio : 1;
  const area = css.width * css.height;
  if (area <= 0) return dpr;
  const byArea = Math.sqrt(maxPixels / area);
  const bySide = maxSide / Math.max(css.width, css.height);
  return Math.min(dpr, byArea, bySide);
}

/** Canvas backing-store size for a CSS size at an output scale, whole device pixels. */
export function canvasPixels(css: Size, scale: number): Size {
  return { width: Math.max(1, Math.floor(css.width * scale)), height: Math.max(1, Math.floor(css.height * scale)) };
}

/** Next zoom step in a direction; from a fitted zoom between steps it goes to the adjacent step. */
export function stepZoom(current: number, direction: 1 | -1): number {
  const eps = 1e-3;
  if (direction === 1) return ZOOM_STEPS.find((z) => z > current * (1 + eps)) ?? MAX_ZOOM;
  return [...ZOOM_STEPS].reverse().find((z) => z < current * (1 - eps)) ?? MIN_ZOOM;
}

export function formatZoom(zoom: number): string {
  return `${Math.round(zoom * 100)}%`;
}

export interface Fraction {
  x: number;
  y: number;
}

const round4 = (v: number) => Math.round(v * 10_000) / 10_000;
const unit = (v: number) => Math.min(1, Math.max(0, v));

/**
 * Position of a pointer on the sheet as a fraction of its box, 0..1 from top-left, to 1e-4
 * (0.004 in on a 36 in sheet: finer than a pin can be placed by hand).
 */
export function fractionFromPoint(clientX: number, clientY: number, rect: { left: number; top: number; width: number; height: number }): Fraction {
  if (rect.width <= 0 || rect.height <= 0) return { x: 0.5, y: 0.5 };
  return { x: round4(unit((clientX - rect.left) / rect.width)), y: round4(unit((clientY - rect.top) / rect.height)) };
}

/** Keyboard crosshair: moves by a fraction of the sheet, kept on the sheet. */
export function movePoint(p: Fraction, dx: number, dy: number): Fraction {
  return { x: round4(unit(p.x + dx)), y: round4(unit(p.y + dy)) };
}

/** Indexes kept mounted around the current one: the sheet itself and at most one either side. */
export function neighbourWindow(index: number, count: number): number[] {
  if (count <= 0 || index < 0 || index >= count) return [];
  return [index - 1, index, index + 1].filter((i) => i >= 0 && i < count);
}
