/** `npm run bench`: every figure the issues ask for, as one table with the goals and ratios. */
import { engineBench } from './engine.bench.ts';
import { printTable, type Figure } from './harness.ts';

const figures: Figure[] = [];
console.log('[bench] engine …');
figures.push(...engineBench());
console.log('');
printTable(figures);
