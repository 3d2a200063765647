import { h, type FunctionalComponent } from 'vue'

/**
 * Markup the product drew itself (the server's drawing of a draft, a point log's pages and key swatches: every text in
 * it escaped where it is written, in shared/plots and shared/reports), as the inner HTML of one element. Written
 * through a render function rather than a template's `v-html`: Vue writes a `v-html` binding again while it hydrates,
 * which parsed, styled and laid out a page's drawing twice; this element's inner HTML is left as the server sent it,
 * and a later change of `html` is written as `v-html` would write it. Attributes (class, data-testid, aria-*) go on
 * the element.
 */
const AppServerMarkup: FunctionalComponent<{ html: string, tag?: string }> = props => h(props.tag ?? 'div', { innerHTML: props.html })
AppServerMarkup.props = { html: { type: String, required: true }, tag: { type: String, default: 'div' } }

export default AppServerMarkup
