// Script payloads for the XSS tests, a trap that notices any of them running, and a scan of the
// DOM for anything a payload could have turned into markup.
import type { BrowserContext, Page } from 'playwright-core';

/**
 * Each payload calls `__floeXss(<tag>)` if it ever runs. The set covers the usual ways text turns
 * into markup or script: raw tags, event handler attributes, breaking out of attributes and
 * elements, URL schemes, SVG and MathML, template syntax, and entity tricks. Kept short enough for
 * single-line fields (the longest is well under 120 characters).
 */
export const XSS_PAYLOADS: readonly string[] = [
  `<script>__floeXss('script')</script>`,
  `<img src=x onerror="__floeXss('img')">`,
  `<svg onload="__floeXss('svg')"></svg>`,
  `"><img src=x onerror=__floeXss('attr')>`,
  `'><svg/onload=__floeXss('quote')>`,
  `</textarea></title><script>__floeXss('close')</script>`,
  `<iframe srcdoc="<script>parent.__floeXss('iframe')</script>"></iframe>`,
  `<a href="javascript:__floeXss('href')">open</a>`,
  `javascript:__floeXss('scheme')`,
  `<math><mtext><img src=x onerror=__floeXss('math')></mtext></math>`,
  `<details open ontoggle=__floeXss('details')>`,
  `{{constructor.constructor('__floeXss("tpl")')()}} \${__floeXss('tpl2')}`,
  `&lt;script&gt;__floeXss('entity')&lt;/script&gt;`,
  `<style>*{background:url("javascript:__floeXss('css')")}</style>`,
];

export interface XssTrap {
  /** Tags of payloads that ran, and dialogs that opened. */
  fired: string[];
}

/** Install before the first navigation: any payload that runs calls the exposed binding. */
export async function installXssTrap(context: BrowserContext): Promise<XssTrap> {
  const trap: XssTrap = { fired: [] };
  await context.exposeBinding('__floeXss', (_source, tag: unknown) => {
    trap.fired.push(String(tag));
  });
  context.on('page', (page) => watchDialogs(page, trap));
  for (const page of context.pages()) watchDialogs(page, trap);
  return trap;
}

function watchDialogs(page: Page, trap: XssTrap): void {
  page.on('dialog', (dialog) => {
    trap.fired.push(`dialog: ${dialog.message()}`);
    void dialog.dismiss();
  });
}

/**
 * Markup that only a payload could have produced: inline scripts, elements with event handler
 * attributes, frames, javascript: links, <style> and <object> elements. Returns a description of
 * each one found (empty when everything rendered as text).
 */
export async function injectedMarkup(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const found: string[] = [];
    for (const el of document.querySelectorAll('*')) {
      const tag = el.tagName.toLowerCase();
      if (tag === 'script' && !el.getAttribute('src')) found.push('inline <script>');
      if (['iframe', 'object', 'embed', 'style', 'frame'].includes(tag)) found.push(`<${tag}>`);
      for (const attr of el.getAttributeNames()) {
        if (attr.startsWith('on')) found.push(`<${tag} ${attr}>`);
        if ((attr === 'href' || attr === 'src' || attr === 'xlink:href') && /^\s*javascript:/i.test(el.getAttribute(attr) ?? '')) found.push(`<${tag} ${attr}=javascript:>`);
      }
    }
    return found;
  });
}

/** How many of the payloads appear literally in the page's visible text. */
export async function payloadsShownAsText(page: Page, payloads: readonly string[]): Promise<number> {
  const text = await page.evaluate(() => document.body.innerText);
  return payloads.filter((p) => text.includes(p)).length;
}
