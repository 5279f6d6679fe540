// @nuxt/eslint writes the Nuxt-aware config (auto-imports, file conventions, the stylistic rules
// switched on in nuxt.config.ts) into the build folder on `nuxt prepare`. `npm test` prepares
// `.nuxt`; POMEWRIGHT_BUILD_DIR moves the build folder, as in nuxt.config.ts.
const buildDir = process.env.POMEWRIGHT_BUILD_DIR || '.nuxt'
const { withNuxt } = await import(`./${buildDir}/eslint.config.mjs`).catch((error) => {
  throw new Error(`${buildDir}/eslint.config.mjs is missing: run \`npx nuxt prepare\` first (${error.message})`)
})

export default withNuxt(
  { ignores: ['**/.nuxt*/', '**/.output*/', '.data/', 'test-results/'] },
  {
    name: 'pomewright/house-style',
    rules: {
      // Our templates keep short elements and their attributes on one line.
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      // Single quotes, but "Brown's Apple" rather than 'Brown\'s Apple'.
      '@stylistic/quotes': ['error', 'single', { allowTemplateLiterals: 'always', avoidEscape: true }],
    },
  },
)
