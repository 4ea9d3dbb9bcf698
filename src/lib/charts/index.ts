// Public face of src/lib/charts: other folders import only this file.
export {};
