/**
 * What a block is about: the one rule lives with the charts (their titles say the same as the
 * cards), re-exported here for the report's cards and the long CSV.
 */
export { subjectsOf, subjectText, type BlockSubject } from '../charts/subject.js';
