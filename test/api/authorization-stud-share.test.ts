import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('stud-share');
