"use client";
/**
 * Renders Observable Plot options into a div: Plot.plot runs in an effect (browser only) and
 * its element replaces the previous one. The width follows the container, so `build` gets it.
 */
import * as Plot from "@observablehq/plot";
import { useEffect, useRef, useState } from "react";
import { useContainerWidth } from "@/app/components/useContainerWidth";
import { typesetSvgText } from "@/lib/charts/typesetSvg";

export function PlotView({ build, testId, label }: { build: (width: number) => Plot.PlotOptions; testId?: string; label: string }) {
  const host = useRef<HTMLDivElement>(null);
  const width = useContainerWidth(host);
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    const el = host.current;
    if (!el || width < 50) return;
    let chart: Element | null = null;
    try {
      chart = Plot.plot(build(width)) as unknown as Element;
      typesetSvgText(chart, document);
      el.replaceChildren(chart);
      setError(null);
    } catch (err) {
      setError((err as Error).message);
    }
    return () => chart?.remove();
  }, [build, width]);

  return (
    <>
      <div ref={host} className="plot-host" data-testid={testId} role="img" aria-label={label} />
      {error && <p className="form-error" role="alert">Chart could not be drawn: {error}</p>}
    </>
  );
}
