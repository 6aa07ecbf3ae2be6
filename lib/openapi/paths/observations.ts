import type { Operation } from "../types";

export const operations: Operation[] = [];
