/** Symmetries of ECAs and of their certificates under reflection and complement (DOMAIN.md §4). */
export { complementRule, complementTable, ecaSymmetryClasses, reflectRule, reflectTable, symmetryClass } from "./ruleSymmetries";
export { SymmetryError, complementCertificate, reflectCertificate } from "./certificateSymmetries";
