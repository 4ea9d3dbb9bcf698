// Public face of src/lib/export: other folders import only this file.
export {};
