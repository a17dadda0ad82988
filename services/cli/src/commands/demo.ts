import type { Out } from '../io.js';
export async function runDemo(_json: boolean, _io: Out): Promise<number> { return 0; }
