// convert-units 2.x ships without types; only the chain the cross-checks use is declared.
declare module 'convert-units' {
  interface Conversion {
    to(unit: string): number;
  }
  interface Converter {
    from(unit: string): Conversion;
  }
  export default function convert(value?: number): Converter;
}
