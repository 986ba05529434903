'use client';

// The same message as the root error page, shown inside the workspace layout so the header stays.
export { default } from '../error';
