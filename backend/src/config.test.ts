import { ConfigError, loadConfig } from './config';

describe('loadConfig', () => {
  it('has defaults for one machine', () => {
    expect(loadConfig({})).toEqual({
      host: '127.0.0.1',
      port: 4300,
      databaseUrl: 'postgres://postgres@127.0.0.1:54329/spanledger',
      logLevel: 'info',
      frontendDist: 'dist/frontend/browser',
      basemapTileUrl: null,
      basemapAttribution: null,
    });
  });

  it('builds the database URL from its parts and prefers DATABASE_URL when given', () => {
    expect(loadConfig({ DB_PORT: '6000', DB_NAME: 'network_b' }).databaseUrl).toBe('postgres://postgres@127.0.0.1:6000/network_b');
    expect(loadConfig({ DATABASE_URL: 'postgres://app@db.internal:5432/register' }).databaseUrl).toBe('postgres://app@db.internal:5432/register');
  });

  it.each([
    [{ PORT: 'eighty' }, /PORT: .*got "eighty"/],
    [{ PORT: '70000' }, /PORT: /],
    [{ DB_PORT: '-1' }, /DB_PORT: /],
    [{ LOG_LEVEL: 'loud' }, /LOG_LEVEL: /],
    [{ DATABASE_URL: 'mysql://x@y/z' }, /DATABASE_URL: /],
    [{ BASEMAP_TILE_URL: 'https://tiles.example.org/tile.png' }, /BASEMAP_TILE_URL: must contain \{z\}, \{x\} and \{y\}/],
  ])('refuses %p naming the setting', (env, message) => {
    expect(() => loadConfig(env)).toThrow(ConfigError);
    expect(() => loadConfig(env)).toThrow(message);
  });

  it('treats an empty setting as unset', () => {
    expect(loadConfig({ PORT: '' }).port).toBe(4300);
  });
});
