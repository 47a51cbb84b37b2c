/** The tool's version as the package declares it (only this field of package.json reaches the bundle). */
import { version } from '../../package.json'

export const TOOL_VERSION: string = version
