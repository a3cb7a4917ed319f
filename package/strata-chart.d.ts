// Type declarations for <strata-chart> (strata-chart.js): its properties,
// methods, attributes and events. The spec's keys are described in full by
// docs/spec.md and the JSON Schema (`strata schema`); here a spec is any
// JSON object with `layers`.

/** Where a problem is and what it is, as the engine reports it. */
export interface StrataDiagnostic {
  severity: 'error' | 'warning';
  /** A short stable code, such as `spec.unknown_column` or `data.ragged_row`. */
  code: string;
  message: string;
  /** JSON path into the spec, such as `layers[0].x`. */
  path?: string;
  /** 1-based line in the data. */
  line?: number;
  /** 1-based column in the data (field number for delimited data). */
  column?: number;
  /** What to do about it, where known. */
  hint?: string;
}

/** A chart spec: a JSON object with at least `layers` (see docs/spec.md). */
export interface StrataSpec {
  layers: Array<Record<string, unknown>>;
  [key: string]: unknown;
}

/** One record of inline data: column name to value. */
export type StrataRow = Record<string, string | number | boolean | null>;

/** `detail` of the `strata-render` event, fired after each drawing. */
export interface StrataRenderDetail {
  /** The chart's size in CSS pixels. */
  width: number;
  height: number;
  /** Lint warnings and reader notes for this drawing. */
  warnings: StrataDiagnostic[];
}

/** `detail` of the `strata-error` event, fired when a drawing (or a download) fails. */
export interface StrataErrorDetail {
  errors: StrataDiagnostic[];
}

export type StrataRenderEvent = CustomEvent<StrataRenderDetail>;
export type StrataErrorEvent = CustomEvent<StrataErrorDetail>;

/** Where an element is (`StrataChart.status`). */
export type StrataStatus = 'idle' | 'waiting' | 'drawing' | 'drawn' | 'baked' | 'error';

/**
 * `<strata-chart>`: draws its spec (a child `<script type="application/json">`,
 * the `spec-src` attribute, or the `spec` property) with the data named by the
 * `src` attribute or the spec's `data.url`.
 *
 * Attributes: `src` (data URL), `spec-src` (spec URL), `shapes-src` (GeoJSON
 * URL of a map, overriding the spec's `shapes.url`), `theme` (`light`,
 * `dark` or `auto`, overriding the spec's), `timeout` (seconds). Each change
 * redraws. `downloads` (present: SVG, PNG and CSV download buttons) and
 * `loading="eager"` (draw at once even far below the fold) do not.
 *
 * The spec's `size.width` is the widest the chart draws; in a narrower
 * container it is drawn at the container's width. A baked SVG (`strata
 * bake`) that fits is kept, with no engine loaded. See docs/element.md.
 */
export declare class StrataChart extends HTMLElement {
  static readonly observedAttributes: string[];
  /** The spec as an object; setting it redraws. `null` until set from JavaScript. */
  get spec(): StrataSpec | null;
  set spec(value: StrataSpec | null);
  /** Records to draw instead of fetched data (write-only). */
  set rows(value: StrataRow[] | null);
  /** Arrow IPC bytes to draw instead of fetched data (write-only). */
  set table(value: Uint8Array | ArrayBuffer | null);
  /** The SVG text of the last drawing, exactly as the engine wrote it ('' before the first, and while a baked SVG is kept). */
  readonly svgText: string;
  /** The data table HTML of the last drawing ('' when the spec asks for none). */
  readonly tableHtml: string;
  /** Where the element is: not drawn yet, waiting far below the fold, drawing, drawn, keeping a baked SVG, or showing an error. */
  readonly status: StrataStatus;
  /**
   * Draw now, near the viewport or not, baked or not; resolves when the element
   * shows its current spec. Failures are shown in the chart's place and fire
   * `strata-error`; nothing is thrown.
   */
  render(): Promise<void>;
  connectedCallback(): void;
  disconnectedCallback(): void;
  attributeChangedCallback(name: string, oldValue: string | null, newValue: string | null): void;

  addEventListener<K extends keyof StrataChartEventMap>(
    type: K,
    listener: (this: StrataChart, ev: StrataChartEventMap[K]) => unknown,
    options?: boolean | AddEventListenerOptions
  ): void;
  addEventListener(type: string, listener: EventListenerOrEventListenerObject, options?: boolean | AddEventListenerOptions): void;
  removeEventListener<K extends keyof StrataChartEventMap>(
    type: K,
    listener: (this: StrataChart, ev: StrataChartEventMap[K]) => unknown,
    options?: boolean | EventListenerOptions
  ): void;
  removeEventListener(type: string, listener: EventListenerOrEventListenerObject, options?: boolean | EventListenerOptions): void;
}

/**
 * The element's events (they bubble). A drawing that finishes after the
 * element left the page, or after a newer drawing started, fires nothing.
 */
export interface StrataChartEventMap extends HTMLElementEventMap {
  'strata-render': StrataRenderEvent;
  'strata-error': StrataErrorEvent;
}

/** One diagnostic as a line of text, as the element shows it. */
export declare function describeError(d: StrataDiagnostic): string;


declare global {
  interface HTMLElementTagNameMap {
    'strata-chart': StrataChart;
  }
  interface GlobalEventHandlersEventMap {
    'strata-render': StrataRenderEvent;
    'strata-error': StrataErrorEvent;
  }
}
