declare module "munkres-js" {
  /** Hungarian method: pairs [row, column] of a minimum-cost assignment (rectangular matrices padded). */
  function munkres(costs: number[][]): [number, number][];
  export default munkres;
}
