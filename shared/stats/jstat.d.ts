// jstat ships no typings; declare only the quantile functions shared/stats uses.
declare module 'jstat' {
  interface JStat {
    studentt: { inv(p: number, dof: number): number }
    centralF: { inv(p: number, df1: number, df2: number): number }
    chisquare: { inv(p: number, dof: number): number }
  }
  const jStat: JStat
  export default jStat
}
