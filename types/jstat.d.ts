declare module 'jstat' {
  export const jStat: {
    chisquare: { cdf(x: number, dof: number): number; inv(p: number, dof: number): number };
    studentt: { cdf(x: number, dof: number): number; inv(p: number, dof: number): number };
    centralF: { cdf(x: number, df1: number, df2: number): number; inv(p: number, df1: number, df2: number): number };
    normal: { cdf(x: number, mean: number, sd: number): number; inv(p: number, mean: number, sd: number): number };
    beta: { inv(p: number, a: number, b: number): number };
    [key: string]: unknown;
  };
}
