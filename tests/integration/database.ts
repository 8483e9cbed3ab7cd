const port = process.env.BEAMWARDEN_PGPORT ?? '54329';
const name = 'beamwarden_test';

export const testDatabase = {
	name,
	adminUrl: `postgres://postgres@127.0.0.1:${port}/postgres`,
	ownerUrl: `postgres://postgres@127.0.0.1:${port}/${name}`,
	appUrl: `postgres://beamwarden_app@127.0.0.1:${port}/${name}`
};
