/**
 * A drawn SVG element as a stand-alone .svg file for slides and papers. The plot sets its
 * colours and font as attributes (not from the page's style sheet), so it looks the same
 * outside the app.
 */
export function svgFile(svg: SVGSVGElement): Blob {
  const text = new XMLSerializer().serializeToString(svg);
  return new Blob([`<?xml version="1.0" encoding="UTF-8"?>\n${text}`], { type: 'image/svg+xml' });
}
