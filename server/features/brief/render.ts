import { readFileSync } from 'node:fs'
import Handlebars from 'handlebars'
import type { BriefView } from './compose'

/**
 * The brief's e-mail templates (Handlebars, compiled once): HTML escapes every value, the plain-text
 * part escapes nothing. Strict mode makes a field the view lacks an error, not an empty string.
 */
const hbs = Handlebars.create()
const source = (name: string) =>
  readFileSync(new URL(`./templates/${name}`, import.meta.url), 'utf8')
hbs.registerPartial('layout', source('layout.html.hbs'))
hbs.registerHelper('concat', (...args: unknown[]) => args.slice(0, -1).join(''))

const html = <T>(name: string) => hbs.compile<T>(source(name), { strict: true })
const text = <T>(name: string) => hbs.compile<T>(source(name), { strict: true, noEscape: true })

const templates = {
  briefHtml: html<BriefView>('brief.html.hbs'),
  briefText: text<BriefView>('brief.txt.hbs'),
  verifyHtml: html<VerifyView>('verify.html.hbs'),
  verifyText: text<VerifyView>('verify.txt.hbs'),
}

export interface RenderedMail {
  subject: string
  html: string
  text: string
}

export function renderBrief(view: BriefView): RenderedMail {
  return { subject: view.subject, html: templates.briefHtml(view), text: templates.briefText(view) }
}

interface VerifyView {
  email: string
  url: string
  hours: number
}

export function renderVerification(view: VerifyView): RenderedMail {
  return {
    subject: 'Confirm your address for the Chopline morning brief',
    html: templates.verifyHtml(view),
    text: templates.verifyText(view),
  }
}
