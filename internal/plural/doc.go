// Package plural writes counts of things in English for messages and
// summaries: "1 problem", "3 problems", "2 entries". Every message that
// counts goes through Count, so that none says "1 problems" and the rule
// for a noun lives in one place.
package plural
