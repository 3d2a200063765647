// One-line, prefixed messages from the project's scripts.
export function log(tag, message) {
  process.stdout.write(`[pastload:${tag}] ${message}\n`)
}
