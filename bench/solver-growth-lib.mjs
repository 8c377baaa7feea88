/** Shared by the solver benches: a scene with its pixel forms resolved and its window replaced (restrictions kept, documentary bounds dropped). */
import { resolvePixelObservations } from '../dist/image/resolvePixels.js';

export function withWindow(scene, fromYear, toYear) {
  const resolved = resolvePixelObservations(scene).scene;
  const { notBefore: _b, notAfter: _a, ...window } = resolved.window;
  return { ...resolved, window: { ...window, fromYear, toYear } };
}

