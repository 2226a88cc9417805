/** Version of physics-core, written into every result's and map's provenance. Kept equal to package.json (tested). */
export const CORE_VERSION = '0.1.0';
