// Debian's Chromium as the bench and the e2e tests start it (headless, through playwright-core,
// which cannot download a browser here): one place for the path and the flags.
export const CHROMIUM = '/usr/bin/chromium';

export const CHROMIUM_FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
