import { readFileSync } from 'node:fs'
import Handlebars from 'handlebars'
import { FIGURE } from '../../../shared/format'

/**
 * E-mail templates (Handlebars, compiled once) in `templates/`: `<name>.html.hbs` inside the shared
 * `{{#> layout}}` partial, and `<name>.txt.hbs`. HTML escapes every value, the plain-text part
 * escapes nothing; strict mode makes a field the view lacks an error, not an empty string.
 */
const hbs = Handlebars.create()
const source = (file: string) =>
  readFileSync(new URL(`./templates/${file}`, import.meta.url), 'utf8')
hbs.registerPartial('layout', source('layout.html.hbs'))
hbs.registerHelper('concat', (...args: unknown[]) => args.slice(0, -1).join(''))

export interface RenderedMail {
  subject: string
  html: string
  text: string
}

/** The pair of templates called `name`, as one function from a view (with its subject) to a mail. */
export function mailTemplate<T extends { subject: string }>(
  name: string,
): (view: T) => RenderedMail {
  const html = hbs.compile<T>(source(`${name}.html.hbs`), { strict: true })
  const text = hbs.compile<T>(source(`${name}.txt.hbs`), { strict: true, noEscape: true })
  return (view) => ({ subject: view.subject, html: keepFigures(html(view)), text: text(view) })
}

const FIGURES = new RegExp(FIGURE.source, 'g')

/** A number and its unit never part at a line end in a mail reader ("16 / mph"). */
export const keepFigures = (html: string) =>
  html.replace(FIGURES, (figure) => figure.replace(' ', '&nbsp;'))
