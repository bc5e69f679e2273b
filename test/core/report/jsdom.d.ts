// The part of jsdom's API the report tests use (the package ships no types; vitest's jsdom
// environment uses the same package). Parses the report's HTML and SVG back in a node test.
declare module 'jsdom' {
  export class JSDOM {
    constructor(html?: string, options?: { contentType?: string });
    readonly window: Window & typeof globalThis;
  }
}
