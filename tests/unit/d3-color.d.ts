// d3-color ships no type declarations; the colour tests use only its Lab and RGB conversions.
declare module 'd3-color' {
  export interface LabColor { l: number; a: number; b: number }
  export interface RGBColor { r: number; g: number; b: number; formatHex(): string }
  export function lab(specifier: string): LabColor;
  export function rgb(specifier: string): RGBColor;
  export function rgb(r: number, g: number, b: number): RGBColor;
}
