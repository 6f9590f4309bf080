import { afterEach, beforeEach, vi } from 'vitest';

export interface CanvasCalls {
  putImageData: number;
  lastImage: ImageData | null;
}

/**
 * jsdom has no 2-D canvas: this gives every canvas a context that records what was drawn,
 * so a test can check that the raster was painted and with which colours.
 */
export function installCanvasMock(): CanvasCalls {
  const calls: CanvasCalls = { putImageData: 0, lastImage: null };
  beforeEach(() => {
    calls.putImageData = 0;
    calls.lastImage = null;
    const context = {
      createImageData: (width: number, height: number) =>
        ({ width, height, data: new Uint8ClampedArray(width * height * 4) }) as ImageData,
      putImageData: (image: ImageData) => {
        calls.putImageData += 1;
        calls.lastImage = image;
      },
    };
    vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockImplementation(
      () => context as unknown as CanvasRenderingContext2D,
    );
  });
  afterEach(() => vi.restoreAllMocks());
  return calls;
}
