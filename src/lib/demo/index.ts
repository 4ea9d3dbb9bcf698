// Public face of src/lib/demo: other folders import only this file.
export {};
