// Runs one named benchmark in a fresh process (so one benchmark's JIT feedback
// cannot slow another) and prints its rows as JSON on the last line.
import { BENCHES } from './engine.bench'

const name = process.argv[2] ?? ''
const bench = BENCHES[name]
if (!bench) {
  console.error(`unknown benchmark "${name}"; known: ${Object.keys(BENCHES).join(', ')}`)
  process.exit(2)
}
console.log(JSON.stringify(await bench()))
