// Plain-language names for issue paths, for the list of problems beside the submit button; shared with the
// server, which words its answers the same way.
export { describeIssuePath } from '@shared/api/issue-path-labels'
