// Public face of src/lib/pendulum: other folders import only this file.
export {};
