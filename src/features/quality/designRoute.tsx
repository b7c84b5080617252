/** Route module for /quality/design (lazy-loaded): design feedback and the shop's heat-transfer coefficient. */
export { DesignFeedbackPage as Component } from './DesignFeedbackPage';
