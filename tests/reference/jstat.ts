/**
 * jStat has no type declarations; this loads it through require and types only
 * the functions the reference checks use (an independent cross-check library).
 */
import { createRequire } from 'node:module';

interface JStatSubset {
  mean(values: number[]): number;
  median(values: number[]): number;
  stdev(values: number[], sample: boolean): number;
  corrcoeff(x: number[], y: number[]): number;
  covariance(x: number[], y: number[]): number;
  quantiles(values: number[], p: number[], alphap: number, betap: number): number[];
  normal: { cdf(x: number, mean: number, sd: number): number; inv(p: number, mean: number, sd: number): number };
}

const require = createRequire(import.meta.url);
export const jStat = (require('jstat') as { jStat: JStatSubset }).jStat;
