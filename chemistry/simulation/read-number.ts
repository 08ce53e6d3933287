// The request's numbers are read by the library-wide readers (chemistry/input.ts).
export { isGiven, NON_NEGATIVE, POSITIVE, readNumber, readOptional, type Bounds } from '../input';
