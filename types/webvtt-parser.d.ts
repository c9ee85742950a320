declare module 'webvtt-parser'
