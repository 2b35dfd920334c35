export function median(xs: number[]): number;
export function percentile(xs: number[], p: number): number;
export function ms(x: number): string;
export function seconds(x: number): string;
export function ratio(x: number): string;
export function kb(bytes: number): string;
export function mb(bytes: number): string;
export function rps(x: number): string;
