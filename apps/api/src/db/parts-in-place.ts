// One definition of "the part is in the mouth", for the Stack and every query that needs the parts
// in place: not removed, and not entered in error by an amendment of the insert change that fitted it.
import { and, isNull } from 'drizzle-orm';
import { componentInstances } from './schema/index.js';

export const partInPlace = () => and(isNull(componentInstances.removedOn), isNull(componentInstances.enteredInErrorAt));
