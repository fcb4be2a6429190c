export { HttpSession, inviteNewAccount, signedInSession } from './http';
export { CHROMIUM_ARGS, CHROMIUM_PATH, launchChromium, signInPage } from './chromium';
export { DEMO, DEMO_PROJECT_NAME } from './demo';
