/** Vitrine's version, from package.json (bundled into the CLI by esbuild). */
import packageJson from '../../package.json' with { type: 'json' };

export const VERSION: string = packageJson.version;
