import { execFileSync } from 'node:child_process';
import { defineConfig } from '@playwright/test';

// Free ports for the app and its mail server, chosen once by the main process; the workers inherit
// them through the environment (the config is read again in each worker).
const pickPort = () =>
	execFileSync(process.execPath, ['-e', "const s=require('net').createServer();s.listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close()})"], { encoding: 'utf8' });
process.env.E2E_PORT ??= pickPort();
process.env.E2E_SMTP_PORT ??= pickPort();
const port = Number(process.env.E2E_PORT);

export default defineConfig({
	testDir: 'tests/e2e',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	// Journeys of several pages with accessibility checks on a shared 2-core machine.
	timeout: 60_000,
	reporter: [['list']],
	use: {
		baseURL: `http://127.0.0.1:${port}`,
		browserName: 'chromium',
		headless: true,
		launchOptions: {
			// Debian's Chromium; never a downloaded browser.
			executablePath: '/usr/bin/chromium',
			args: ['--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic']
		},
		trace: 'off'
	},
	webServer: {
		command: 'bash scripts/e2e-server.sh',
		url: `http://127.0.0.1:${port}/api/health`,
		reuseExistingServer: false,
		timeout: 180_000,
		stdout: 'ignore',
		stderr: 'pipe'
	}
});
