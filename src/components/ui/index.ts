export { Button } from './button';
export { Checkbox, FieldShell, Input, NamedOptions, PlainOptions, Select, TextArea, TextField } from './field';
export { Card, Notice, PageHeader, SectionCard, SectionHeading, Spinner } from './card';
export { ErrorNotice } from './error-notice';
export { Confirm } from './confirm';
// Term (React Aria's tooltip) is imported from './term' by the pages that use it, so the first
// page (sign-in and projects list) does not carry the overlay code.
