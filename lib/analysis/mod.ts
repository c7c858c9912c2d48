/**
 * Whole-spectrum operations built on several layers: conversion of what a spectrum holds and
 * where it is sampled.
 *
 * @module
 */
export * from "./convert_spectrum.ts";
