/** nuxt-security's table of the built files' integrity hashes (path under the site → `sha384-…`). */
declare module '#sri-hashes' {
  const hashes: Record<string, string>
  export default hashes
}
