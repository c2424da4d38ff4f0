// @vitest-environment happy-dom
/**
 * ErrorBoundary: a region that throws while rendering shows what failed and a way to try again; the rest
 * of the page is untouched. (React's documented contract for getDerivedStateFromError; no outside figure.)
 */
import { act } from 'react';
import { createRoot } from 'react-dom/client';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ErrorBoundary } from '../../../src/components/errors/error-boundary';

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

let broken = true;
function Fragile() {
  if (broken) throw new Error('the map data is not readable');
  return <p>map drawn</p>;
}

describe('ErrorBoundary', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    vi.restoreAllMocks();
  });

  it('shows the region and the error, keeps its siblings, and renders again on "Try again"', async () => {
    vi.spyOn(console, 'error').mockImplementation(() => undefined); // React reports the caught error too
    const host = document.createElement('div');
    document.body.append(host);
    const root = createRoot(host);
    await act(async () => {
      root.render(
        <div>
          <p>readout</p>
          <ErrorBoundary region="The map">
            <Fragile />
          </ErrorBoundary>
        </div>,
      );
    });
    expect(host.textContent).toContain('readout');
    expect(host.querySelector('[role="alert"]')?.textContent).toBe('The map could not be shown: the map data is not readable');
    broken = false;
    await act(async () => {
      host.querySelector('button')!.click();
    });
    expect(host.textContent).toContain('map drawn');
    expect(host.querySelector('[role="alert"]')).toBeNull();
    await act(async () => root.unmount());
  });
});
