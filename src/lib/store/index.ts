// Public face of src/lib/store: other folders import only this file.
export {};
