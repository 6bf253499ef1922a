/**
 * vega-lite → SVG in Node, with no canvas (vega and vega-lite load only when a page is made).
 * Inline SVG in HTML5 needs no namespace declarations; dropping them keeps the page free of URLs.
 */
type VegaModules = [typeof import('vega'), typeof import('vega-lite')];
let modules: Promise<VegaModules> | undefined;
const load = () => (modules ??= Promise.all([import('vega'), import('vega-lite')]));

/** Drops namespace declarations and keeps one decimal in path data (a tenth of a pixel), which halves a spectrum's size. */
const stripNamespaces = (svg: string) => svg.replace(/ xmlns(:xlink)?="[^"]*"/g, '').replace(/ d="([^"]*)"/g, (_m, d: string) => ` d="${d.replace(/(\.\d)\d+/g, '$1')}"`);

/** Compiles one vega-lite specification and renders it to an SVG string. */
export async function renderSvg(spec: object): Promise<string> {
  const [vega, vl] = await load();
  const view = new vega.View(vega.parse(vl.compile(spec as never).spec), { renderer: 'none' });
  try {
    return stripNamespaces(await view.toSVG());
  } finally {
    view.finalize();
  }
}

/**
 * One compiled view rendered many times with new named data sets (the spectra: one spec, many
 * runs) — compiling once saves most of the time a chart costs.
 */
export class SvgRenderer {
  private view: import('vega').View | undefined;
  constructor(private readonly spec: object) {}

  async render(data: Record<string, readonly object[]>): Promise<string> {
    const [vega, vl] = await load();
    this.view ??= new vega.View(vega.parse(vl.compile(this.spec as never).spec), { renderer: 'none' });
    for (const [name, values] of Object.entries(data)) this.view.data(name, values as object[]);
    await this.view.runAsync();
    return stripNamespaces(await this.view.toSVG());
  }

  finalize(): void {
    this.view?.finalize();
    this.view = undefined;
  }
}
