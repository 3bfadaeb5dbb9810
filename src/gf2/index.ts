export * from './bitmatrix.js';
export * from './popcount.js';
export * from './rowops.js';
export * from './transpose.js';
export { multiply, multiplyTransposed, multiplyVector } from './product.js';
export * from './elimination.js';
export * from './kernel.js';
export * from './solve.js';
export * from './basis.js';
