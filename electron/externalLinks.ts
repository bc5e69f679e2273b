/**
 * Links to web pages leave the app only after the user agrees: a page could otherwise send
 * them anywhere without a click they meant. The dialog shows the address exactly as it will be
 * opened (parsed, so a host in another script shows as its punycode form).
 */
import { BrowserWindow, shell } from 'electron';
import { showMessageBox } from './electronExtras';
import { isExternalHttpUrl } from './windowOptions';

/** Longer addresses are not offered: the dialog could not show them whole. */
export const MAX_LINK_LENGTH = 2048;
/** Index of the button that opens the link; Cancel (0) is the default and the Escape answer. */
const OPEN_BUTTON = 1;

/** Asks, then opens an http(s) link in the system browser; resolves to whether it opened. */
export async function openLinkAfterAsking(url: string): Promise<boolean> {
  if (!isExternalHttpUrl(url) || url.length > MAX_LINK_LENGTH) return false;
  const href = new URL(url).href;
  const { response } = await showMessageBox(BrowserWindow.getFocusedWindow(), {
    type: 'question',
    buttons: ['Cancel', 'Open in browser'],
    defaultId: 0,
    cancelId: 0,
    noLink: true,
    title: 'Open a web page',
    message: 'Open this address in your web browser?',
    detail: href,
  });
  if (response !== OPEN_BUTTON) return false;
  await shell.openExternal(href);
  return true;
}
