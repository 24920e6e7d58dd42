import { chromium } from 'playwright-core';
const base = 'http://127.0.0.1:3216';
const ctx = await chromium.launchPersistentContext('/tmp/report-shots/profile', {
	executablePath: '/usr/bin/chromium', headless: true, viewport: { width: 1280, height: 800 },
	args: ['--no-sandbox','--disable-gpu','--disable-quic','--no-first-run','--disable-background-networking','--disable-component-update','--disable-sync']
});
const page = await ctx.newPage();
await page.goto(base + '/signin');
await page.fill('input[type=email]', 'lender@furrowcast.test');
await page.fill('input[type=password]', 'furrowcast-demo');
await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/signin')), page.click('form button[type=submit], form button:not([type])')]);
await page.goto(base + '/farms');
const links = await page.$$eval('a[href*="/plans/"]', (as) => as.map((a) => a.getAttribute('href')));
console.log(links.slice(0, 8));
const planHref = process.argv[2] ?? links.find((l) => /\/plans\/[0-9a-f-]{36}/.test(l));
const planPath = planHref.match(/\/farms\/[^/]+\/plans\/[0-9a-f-]{36}/)[0];
await page.goto(base + planPath + '/report');
await page.waitForLoadState('networkidle');
await page.screenshot({ path: '/tmp/report-shots/report-1280.png', fullPage: true });
const box = await page.locator('#risk-and-cash-flow').boundingBox();
console.log('risk section', box);
await page.pdf({ path: '/tmp/report-shots/report.pdf', format: 'Letter', printBackground: true });
console.log(planPath);
await ctx.close();
