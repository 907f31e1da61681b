import withNuxt from './.nuxt/eslint.config.mjs'

// @nuxt/eslint's config composer (eslint-flat-config-utils 3) calls Object.groupBy, which Node 20 lacks;
// the composer only runs when ESLint awaits the export below, so defining it here is early enough.
if (typeof Object.groupBy !== 'function') {
  Object.groupBy = (items, keyOf) => {
    const groups = Object.create(null)
    let index = 0
    for (const item of items) (groups[keyOf(item, index++)] ??= []).push(item)
    return groups
  }
}

export default withNuxt({
  ignores: ['var/**', 'test-output/**', '.data/**', 'public/library/drawings/**'],
})
