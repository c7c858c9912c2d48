/**
 * Crystal optics: host refractive indices, Fresnel surfaces, slab transmittance and its
 * inversion, path-length rescaling, polarisation averaging.
 *
 * @module
 */
export * from "./refractive_index.ts";
export * from "./slab.ts";
export * from "./path_transmittance.ts";
export { HOSTS } from "./data/hosts.ts";
