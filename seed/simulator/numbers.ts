// Day arithmetic and rounding shared by the parts of a unit's simulation.
export const DAY_MS = 86_400_000;

export const clamp = (x: number, lo: number, hi: number) => (x < lo ? lo : x > hi ? hi : x);
export const roundTo = (x: number, step: number) => Math.round(x / step) * step;
export const r3 = (x: number) => Math.round(x * 1000) / 1000;
export const r1 = (x: number) => Math.round(x * 10) / 10;
export const isoDay = (day: number) => new Date(day * DAY_MS).toISOString().slice(0, 10);
