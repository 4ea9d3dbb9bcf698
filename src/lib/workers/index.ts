// Public face of src/lib/workers: other folders import only this file.
export {};
