// Minimal typing for the parts of js-quantities (no bundled types) used as a test reference.
declare module 'js-quantities' {
  interface Quantity {
    to(unit: string): Quantity;
    scalar: number;
  }
  function Qty(expr: string): Quantity;
  export default Qty;
}
