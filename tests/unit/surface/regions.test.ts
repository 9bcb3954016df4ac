import { describe, expect, it } from "vitest";
import { maskRegion } from "../../../lib/surface/regions";

/** The signed area of a closed ring (shoelace formula). */
const signedArea = (ring: Array<[number, number]>) => ring.reduce((s, p, i) => { const q = ring[(i + 1) % ring.length]!; return s + p[0] * q[1] - q[0] * p[1]; }, 0) / 2;
const axis = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));

describe("a grid mask as outlines and a label point", () => {
  it("a block of marked samples: its edge runs halfway between marked and unmarked samples (marching squares at ½)", () => {
    // Samples at 0, 1, …, 10 on both axes; x ≥ 6 marked. The edge is at x = 5.5; the grid's border closes it.
    const xs = axis(0, 10, 11);
    const mask = xs.map(() => xs.map((x) => x >= 6));
    const r = maskRegion(mask, xs, xs);
    expect(r.rings).toHaveLength(1);
    const ring = r.rings[0]!;
    expect(Math.min(...ring.map((p) => p[0]))).toBeCloseTo(5.5, 12);
    expect(Math.max(...ring.map((p) => p[0]))).toBe(10);
    expect(Math.abs(signedArea(ring))).toBeCloseTo(4.5 * 10, 9); // 4.5 wide, 10 high
    expect(r.share).toBeCloseTo(55 / 121, 12);
    // The label: the marked sample farthest from the edge and the border, the most central of ties.
    expect(r.label).toEqual([8, 5]);
  });
  it("a disc: the outline's area approaches πr² as the grid gets finer (geometry)", () => {
    for (const n of [41, 161]) {
      const xs = axis(-2, 2, n);
      const mask = xs.map((y) => xs.map((x) => x * x + y * y < 1));
      const r = maskRegion(mask, xs, xs);
      expect(r.rings).toHaveLength(1);
      const h = 4 / (n - 1);
      // Within about one cell's width along the circumference.
      expect(Math.abs(Math.abs(signedArea(r.rings[0]!)) - Math.PI)).toBeLessThan(2 * Math.PI * h);
      expect(Math.hypot(...r.label!)).toBeLessThanOrEqual(h);
    }
  });
  it("a ring-shaped region has a hole wound the other way (a non-zero fill leaves it open)", () => {
    const xs = axis(-3, 3, 61);
    const mask = xs.map((y) => xs.map((x) => x * x + y * y < 4 && x * x + y * y > 1));
    const r = maskRegion(mask, xs, xs);
    expect(r.rings).toHaveLength(2);
    const [a, b] = r.rings.map(signedArea);
    expect(Math.sign(a!)).toBe(-Math.sign(b!));
    expect(Math.abs(Math.abs(a!) - Math.abs(b!))).toBeCloseTo(3 * Math.PI, 0); // π·2² − π·1²
  });
  it("puts the label inside the part asked for when it meets the region, and maps uneven axes", () => {
    const xs = [1, 2, 4, 8, 16, 32, 64, 128, 256, 512, 1024]; // a log-spaced axis
    const ys = axis(0, 1, 11);
    const mask = ys.map(() => xs.map(() => true));
    const part = ys.map((y) => xs.map((x) => x <= 4 && y >= 0.5));
    const r = maskRegion(mask, xs, ys, part);
    expect(part[ys.indexOf(r.label![1])]![xs.indexOf(r.label![0])]).toBe(true);
    expect(maskRegion(ys.map(() => xs.map(() => false)), xs, ys)).toEqual({ rings: [], label: null, share: 0 });
    expect(() => maskRegion([[true]], xs, ys)).toThrow(RangeError);
  });
});
