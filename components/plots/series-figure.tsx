'use client';

import { Button } from '@/components/ui/button';
import * as Plot from '@observablehq/plot';
import { useEffect, useRef, useState } from 'react';
import { buildFigure } from '@/lib/plot/data-block-plots';
import type { OutputValue, SeriesData } from '@/lib/sheet/types';

/** Replaces CSS variables and currentColor with the computed colours, so a download looks the same. */
function standaloneSvg(svg: SVGSVGElement): string {
  const style = getComputedStyle(svg);
  const root = getComputedStyle(document.documentElement);
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  let text = new XMLSerializer().serializeToString(clone);
  text = text.replace(/var\((--[a-z-]+)\)/g, (_, name: string) => root.getPropertyValue(name).trim() || '#000');
  text = text.replace(/currentColor/g, style.color || '#000');
  const background = root.getPropertyValue('--chalk').trim() || '#fff';
  return text.replace(/<svg([^>]*)>/, `<svg$1><rect width="100%" height="100%" fill="${background}"/>`);
}

function download(name: string, blob: Blob) {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = name;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/**
 * One figure of a block's series drawn with Observable Plot (rendered in an effect, removed on
 * cleanup). `seriesName` names the figure (figureNames in lib/plot/data-block-plots: one per
 * series, or a combined figure for the data blocks); `series` holds all of the block's series.
 */
export default function SeriesFigure({
  blockName,
  blockType,
  seriesName,
  series,
  outputs,
}: {
  blockName: string;
  blockType: string;
  seriesName: string;
  series: Record<string, SeriesData>;
  /** The block's outputs, for marks at exact values (the transition, the forebulge). */
  outputs?: Record<string, OutputValue>;
}) {
  const holder = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(640);
  const [caption, setCaption] = useState('');

  useEffect(() => {
    const element = holder.current;
    if (!element) return;
    const observer = new ResizeObserver((entries) => {
      const next = Math.round(entries[0]?.contentRect.width ?? 640);
      if (next > 0) setWidth((w) => (Math.abs(w - next) > 8 ? next : w));
    });
    observer.observe(element);
    return () => observer.disconnect();
  }, []);

  useEffect(() => {
    const element = holder.current;
    if (!element) return;
    const spec = buildFigure(blockType, seriesName, series, { width: Math.max(280, Math.min(width, 900)) }, outputs);
    const figure = Plot.plot(spec.options);
    // The figure is one image for assistive technology: the marks' own labels are dropped.
    figure.querySelectorAll('[aria-label], [aria-description]').forEach((node) => {
      node.removeAttribute('aria-label');
      node.removeAttribute('aria-description');
    });
    figure.setAttribute('role', 'img');
    figure.setAttribute('aria-label', `${spec.title} of ${blockName}: ${spec.description}`);
    element.append(figure);
    setCaption(spec.description);
    return () => figure.remove();
  }, [blockName, blockType, seriesName, series, width, outputs]);

  const svgElement = () => holder.current?.querySelector('svg') ?? null;
  const fileName = `${blockName}-${seriesName}`;

  const downloadSvg = () => {
    const svg = svgElement();
    if (svg) download(`${fileName}.svg`, new Blob([standaloneSvg(svg)], { type: 'image/svg+xml' }));
  };
  const downloadPng = () => {
    const svg = svgElement();
    if (!svg) return;
    const { width: w, height: h } = svg.getBoundingClientRect();
    const image = new Image();
    image.onload = () => {
      const scale = 2;
      const canvas = document.createElement('canvas');
      canvas.width = Math.round(w * scale);
      canvas.height = Math.round(h * scale);
      const context = canvas.getContext('2d');
      if (!context) return;
      context.scale(scale, scale);
      context.drawImage(image, 0, 0, w, h);
      canvas.toBlob((blob) => blob && download(`${fileName}.png`, blob), 'image/png');
    };
    image.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(standaloneSvg(svg))}`;
  };

  return (
    <figure className="mt-3 rounded-[3px] border border-rule p-2" data-series={seriesName}>
      <div ref={holder} className="plot-figure" />
      <figcaption className="mt-1 flex flex-wrap items-center justify-between gap-2 text-[12px] text-slate">
        <span>{caption}</span>
        <span className="flex gap-1.5">
          <Button size="sm" onClick={downloadSvg}>
            Download SVG
          </Button>
          <Button size="sm" onClick={downloadPng}>
            Download PNG
          </Button>
        </span>
      </figcaption>
    </figure>
  );
}
