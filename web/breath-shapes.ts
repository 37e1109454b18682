// The breath view's shapes live in the core (src/report/html/breath-shapes.ts) so the HTML report draws the same ones.
export * from '../src/report/html/breath-shapes';
