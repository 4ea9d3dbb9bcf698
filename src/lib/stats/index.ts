// Public face of src/lib/stats: other folders import only this file.
export {};
