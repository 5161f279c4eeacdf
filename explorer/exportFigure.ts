/**
 * Saving the figure shown in a container: the SVG as it is (styles are attributes, so it stands
 * alone), or a PNG drawn from it at twice its size through a canvas.
 */

/** PNG pixels per SVG px. */
const PNG_SCALE = 2;

function download(href: string, name: string): void {
  const a = document.createElement('a');
  a.href = href;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
}

function svgText(box: HTMLElement): string | undefined {
  const svg = box.querySelector('svg');
  return svg ? new XMLSerializer().serializeToString(svg) : undefined;
}

/** Saves the container's figure as `<name>.svg`. */
export function exportSvg(box: HTMLElement, name: string): void {
  const text = svgText(box);
  if (text === undefined) return;
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
  download(url, `${name}.svg`);
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** Saves the container's figure as `<name>.png`. */
export function exportPng(box: HTMLElement, name: string): void {
  const text = svgText(box);
  const svg = box.querySelector('svg');
  if (text === undefined || !svg) return;
  const width = Number(svg.getAttribute('width'));
  const height = Number(svg.getAttribute('height'));
  const image = new Image();
  image.onload = () => {
    const canvas = document.createElement('canvas');
    canvas.width = width * PNG_SCALE;
    canvas.height = height * PNG_SCALE;
    const g = canvas.getContext('2d');
    if (!g) return;
    g.scale(PNG_SCALE, PNG_SCALE);
    g.drawImage(image, 0, 0, width, height);
    download(canvas.toDataURL('image/png'), `${name}.png`);
  };
  image.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(text)}`;
}
