export { mentorshipKeys } from './api/keys';
export { MentorshipSummary } from './components/mentorship-summary';
