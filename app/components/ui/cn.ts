// Joins class names, skipping empty ones (class-variance-authority's cx, which is clsx).
export { cx as cn } from "class-variance-authority";
