// fontkit comes with @react-pdf/renderer (through @react-pdf/font) and has no types of its own.
declare module 'fontkit';
