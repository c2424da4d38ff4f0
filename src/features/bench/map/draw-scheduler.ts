/** Which of the map's three layers need drawing. */
export interface Layers {
  map: boolean;
  guides: boolean;
  cursor: boolean;
}

export interface DrawScheduler {
  /** Marks layers to draw; they are drawn together in the next animation frame. */
  request(what: Partial<Layers>): void;
  cancel(): void;
}

/**
 * Many changes in one frame (chunks of a map arriving, the pointer, the zoom) make one redraw: each
 * asks for the layers it touched, and the next animation frame draws those.
 */
export function createDrawScheduler(draw: (layers: Layers) => void): DrawScheduler {
  let need: Layers = { map: false, guides: false, cursor: false };
  let frame: number | null = null;
  const run = () => {
    frame = null;
    const n = need;
    need = { map: false, guides: false, cursor: false };
    draw(n);
  };
  return {
    request(what) {
      Object.assign(need, what);
      if (frame === null) frame = requestAnimationFrame(run);
    },
    cancel() {
      if (frame !== null) cancelAnimationFrame(frame);
      frame = null;
    },
  };
}
