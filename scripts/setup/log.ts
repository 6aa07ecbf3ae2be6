/** Console output of the set-up scripts, prefixed so it reads apart from the services' own lines. */
export function say(message: string): void {
  console.log(`rootbank: ${message}`);
}

export function fail(message: string): never {
  console.error(`rootbank: ${message}`);
  process.exit(1);
}
