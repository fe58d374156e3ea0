/** The "spider" data distributed with R iNEXT, stand "Girdled" (N = 168, S = 26). */
export const GIRDLED: readonly number[] = [46, 22, 17, 15, 15, 9, 8, 6, 6, 4, 2, 2, 2, 2, ...Array<number>(12).fill(1)];
