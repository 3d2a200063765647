/** A TCP port on 127.0.0.1 that nothing listens on right now (the OS picks it). */
export function freePort(): Promise<number>
