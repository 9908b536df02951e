// s3rver ships no types; the storage fake uses only its constructor and run/close.
declare module 's3rver';
