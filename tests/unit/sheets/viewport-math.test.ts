import { describe, expect, it } from "vitest";
import {
  CSS_PX_PER_PT,
  MAX_CANVAS_PIXELS,
  MAX_CANVAS_SIDE,
  MAX_ZOOM,
  MIN_ZOOM,
  STAGE_PADDING,
  canvasPixels,
  cssSize,
  fractionFromPoint,
  movePoint,
  neighbourWindow,
  outputScale,
  resolveZoom,
  stepZoom,
} from "@/components/sheets/viewport-math";

// PDF default user space: 1 unit = 1/72 in (ISO 32000-1:2008 §8.3.2.3 "User space", section number from memory).
const PT_PER_IN = 72;
// CSS absolute lengths: 1in = 96px (CSS Values and Units Module Level 3, "Absolute lengths", from memory).
const CSS_PX_PER_IN = 96;
// ANSI D 22 × 34 in (ASME Y14.1, from memory), landscape.
const ANSI_D = { width: 34 * PT_PER_IN, height: 22 * PT_PER_IN };
// ARCH D 24 × 36 in, the usual US architectural sheet (common practice, no source), landscape.
const ARCH_D = { width: 36 * PT_PER_IN, height: 24 * PT_PER_IN };
// US Letter 8.5 × 11 in (ANSI A, ASME Y14.1, from memory), portrait.
const LETTER = { width: 8.5 * PT_PER_IN, height: 11 * PT_PER_IN };

describe("printed size", () => {
  it("one PDF point is 96/72 CSS px, so zoom 1 shows a sheet at its printed size", () => {
    expect(CSS_PX_PER_PT).toBeCloseTo(CSS_PX_PER_IN / PT_PER_IN, 12);
    const s = cssSize(ARCH_D, 1);
    expect(s.width).toBeCloseTo(36 * CSS_PX_PER_IN, 9); // 3456 px: 36 in at 96 px/in
    expect(s.height).toBeCloseTo(24 * CSS_PX_PER_IN, 9);
  });

  it("size scales linearly with zoom", () => {
    const half = cssSize(ANSI_D, 0.5);
    expect(half.width).toBeCloseTo((34 * CSS_PX_PER_IN) / 2, 9);
    expect(half.height).toBeCloseTo((22 * CSS_PX_PER_IN) / 2, 9);
  });
});

describe("fit width and fit page", () => {
  it("fit width makes the sheet exactly as wide as the view less its margins", () => {
    const box = { width: 1200, height: 700 };
    const z = resolveZoom({ mode: "fit-width" }, ANSI_D, box);
    expect(cssSize(ANSI_D, z).width).toBeCloseTo(box.width - 2 * STAGE_PADDING, 9);
  });

  it("fit page is limited by height when the view is wide and short", () => {
    const box = { width: 3000, height: 500 };
    const z = resolveZoom({ mode: "fit-page" }, ANSI_D, box);
    const s = cssSize(ANSI_D, z);
    expect(s.height).toBeCloseTo(box.height - 2 * STAGE_PADDING, 9);
    expect(s.width).toBeLessThan(box.width - 2 * STAGE_PADDING);
  });

  it("fit page is limited by width when the view is narrow and tall, and then equals fit width", () => {
    const box = { width: 600, height: 2000 };
    expect(resolveZoom({ mode: "fit-page" }, ARCH_D, box)).toBeCloseTo(resolveZoom({ mode: "fit-width" }, ARCH_D, box), 12);
  });

  it("the sheet always fits inside the view after fit page", () => {
    for (const box of [
      { width: 800, height: 600 },
      { width: 1920, height: 1080 },
      { width: 390, height: 844 },
    ]) {
      for (const page of [ANSI_D, ARCH_D, LETTER]) {
        const s = cssSize(page, resolveZoom({ mode: "fit-page" }, page, box));
        expect(s.width).toBeLessThanOrEqual(box.width - 2 * STAGE_PADDING + 1e-9);
        expect(s.height).toBeLessThanOrEqual(box.height - 2 * STAGE_PADDING + 1e-9);
      }
    }
  });

  it("a chosen zoom is kept within the zoom range", () => {
    expect(resolveZoom({ mode: "zoom", zoom: 50 }, ARCH_D, { width: 1000, height: 800 })).toBe(MAX_ZOOM);
    expect(resolveZoom({ mode: "zoom", zoom: 0.001 }, ARCH_D, { width: 1000, height: 800 })).toBe(MIN_ZOOM);
    expect(resolveZoom({ mode: "zoom", zoom: Number.NaN }, ARCH_D, { width: 1000, height: 800 })).toBe(1);
  });
});

describe("canvas size cap", () => {
  // 16.7 MP = 4096 × 4096 = 2^24 device pixels: the long-standing default of pdf.js's
  // maxCanvasPixels (pdf.js web viewer options, from memory).
  it("the cap is 4096 × 4096 device pixels", () => {
    expect(MAX_CANVAS_PIXELS).toBe(4096 * 4096);
  });

  it("below the cap the canvas follows the screen's pixel ratio exactly", () => {
    const css = cssSize(LETTER, 1); // 816 × 1056 CSS px
    expect(outputScale(css, 2)).toBe(2);
    expect(canvasPixels(css, 2)).toEqual({ width: 8.5 * 96 * 2, height: 11 * 96 * 2 });
  });

  it("above the cap the canvas is shrunk to the cap, keeping the sheet's proportions", () => {
    const css = cssSize(ARCH_D, 2); // 6912 × 4608 CSS px; at ratio 2 that would be 127 MP
    const scale = outputScale(css, 2);
    expect(scale).toBeLessThan(2);
    const px = canvasPixels(css, scale);
    expect(px.width * px.height).toBeLessThanOrEqual(MAX_CANVAS_PIXELS);
    // Not needlessly soft: within 0.1 % of the cap.
    expect(px.width * px.height).toBeGreaterThan(0.999 * MAX_CANVAS_PIXELS);
    expect(px.width / px.height).toBeCloseTo(36 / 24, 2);
  });

  it("a long narrow sheet is held to the widest canvas the browser makes", () => {
    // 200 in × 2 in strip: area is small but the long side would pass Chromium's 32 767 px limit (from memory).
    const css = cssSize({ width: 200 * PT_PER_IN, height: 2 * PT_PER_IN }, 2);
    const px = canvasPixels(css, outputScale(css, 1));
    expect(MAX_CANVAS_SIDE).toBe(32_767);
    expect(Math.max(px.width, px.height)).toBeLessThanOrEqual(MAX_CANVAS_SIDE);
  });

  it("a bad device pixel ratio falls back to 1", () => {
    expect(outputScale({ width: 100, height: 100 }, 0)).toBe(1);
    expect(outputScale({ width: 100, height: 100 }, Number.NaN)).toBe(1);
  });
});

describe("zoom steps", () => {
  it("from a fitted zoom between steps, each direction goes to the adjacent step", () => {
    expect(stepZoom(0.31, 1)).toBe(0.33);
    expect(stepZoom(0.31, -1)).toBe(0.25);
  });

  it("from a step, it moves one step", () => {
    expect(stepZoom(1, 1)).toBe(1.25);
    expect(stepZoom(1, -1)).toBe(0.75);
  });

  it("stops at the ends", () => {
    expect(stepZoom(MAX_ZOOM, 1)).toBe(MAX_ZOOM);
    expect(stepZoom(MIN_ZOOM, -1)).toBe(MIN_ZOOM);
  });

  it("zooming in always enlarges and zooming out always shrinks, inside the range", () => {
    for (let z = MIN_ZOOM; z < MAX_ZOOM; z *= 1.07) {
      expect(stepZoom(z, 1)).toBeGreaterThan(z);
      if (z > MIN_ZOOM * 1.01) expect(stepZoom(z, -1)).toBeLessThan(z);
    }
  });
});

describe("pin position from a click", () => {
  const rect = { left: 100, top: 50, width: 800, height: 400 };

  it("the centre of the sheet is (0.5, 0.5) and the top-left corner is (0, 0)", () => {
    expect(fractionFromPoint(500, 250, rect)).toEqual({ x: 0.5, y: 0.5 });
    expect(fractionFromPoint(100, 50, rect)).toEqual({ x: 0, y: 0 });
    expect(fractionFromPoint(900, 450, rect)).toEqual({ x: 1, y: 1 });
  });

  it("a click in the margin lands on the sheet's edge", () => {
    expect(fractionFromPoint(50, 500, rect)).toEqual({ x: 0, y: 1 });
  });

  it("the same spot gives the same fraction at any zoom", () => {
    const a = fractionFromPoint(100 + 0.3 * 800, 50 + 0.7 * 400, rect);
    const big = { left: -2000, top: -900, width: 3200, height: 1600 };
    const b = fractionFromPoint(-2000 + 0.3 * 3200, -900 + 0.7 * 1600, big);
    expect(b).toEqual(a);
    expect(a).toEqual({ x: 0.3, y: 0.7 });
  });

  it("is kept to four decimals", () => {
    const f = fractionFromPoint(100 + 800 / 3, 50 + 400 / 7, rect);
    expect(f.x).toBe(0.3333);
    expect(f.y).toBe(0.1429);
  });

  it("the keyboard crosshair stays on the sheet", () => {
    expect(movePoint({ x: 0.995, y: 0.5 }, 0.05, 0)).toEqual({ x: 1, y: 0.5 });
    expect(movePoint({ x: 0.5, y: 0.02 }, 0, -0.05)).toEqual({ x: 0.5, y: 0 });
    expect(movePoint({ x: 0.5, y: 0.5 }, 0.01, 0.01)).toEqual({ x: 0.51, y: 0.51 });
  });
});

describe("sheets kept mounted", () => {
  it("is the current sheet and at most one neighbour each side, whatever the set size", () => {
    expect(neighbourWindow(0, 200)).toEqual([0, 1]);
    expect(neighbourWindow(57, 200)).toEqual([56, 57, 58]);
    expect(neighbourWindow(199, 200)).toEqual([198, 199]);
    expect(neighbourWindow(0, 1)).toEqual([0]);
    expect(neighbourWindow(0, 0)).toEqual([]);
    for (let i = 0; i < 200; i++) expect(neighbourWindow(i, 200).length).toBeLessThanOrEqual(3);
  });
});
