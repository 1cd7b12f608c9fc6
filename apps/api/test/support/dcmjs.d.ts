// dcmjs ships no type declarations; the tests use it only to write DICOM fixtures.
declare module 'dcmjs';
