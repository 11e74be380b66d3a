import { describe, expect, it } from "vitest";
import { parseArxivId, parseDoi, parseReference } from "./index";

describe("DOI syntax (DOI Handbook §2.2; examples recalled from the Handbook, marked where from memory)", () => {
  it.each([
    ["10.1000/182", "10.1000/182"], // the DOI of the DOI Handbook itself (recalled from memory)
    ["10.1000/ISBN1-900512-44-0", "10.1000/isbn1-900512-44-0"], // Handbook §2.2 suffix example (recalled from memory)
    ["doi:10.1103/PhysRevE.73.026203", "10.1103/physreve.73.026203"], // written form "doi:" (Handbook §2.6.1, recalled)
    ["https://doi.org/10.1103/PhysRevLett.92.074105", "10.1103/physrevlett.92.074105"], // resolver URL form
    ["10.1000.10/123456", "10.1000.10/123456"], // a subdivided registrant code (Handbook §2.2.2, recalled)
  ])("accepts %s", (input, normal) => {
    expect(parseDoi(input)).toBe(normal);
  });

  it.each([
    ["11.1000/182", "directory indicator must be 10"],
    ["10.1000", "no suffix"],
    ["10./182", "empty registrant code"],
    ["10.10a0/182", "registrant code is digits"],
    ["10.1000/", "empty suffix"],
    ["10.1000/has space", "white space in the suffix"],
    ["arXiv:0706.0001", "an arXiv identifier is not a DOI"],
  ])("refuses %s (%s)", (input) => {
    expect(parseDoi(input)).toBeNull();
  });
});

describe("arXiv identifier syntax (arXiv documentation, “Understanding the arXiv identifier”)", () => {
  it.each([
    ["arXiv:0706.0001", "0706.0001"], // the first identifier of the 2007 scheme, as in the documentation
    ["0706.0001v2", "0706.0001v2"],
    ["1412.9999", "1412.9999"], // last month of four-digit numbers
    ["1501.00001", "1501.00001"], // five digits from January 2015, as in the documentation
    ["hep-th/9901001", "hep-th/9901001"], // old scheme, as in the documentation
    ["math.GT/0309136", "math.GT/0309136"], // old scheme with subject class, as in the documentation
    ["cond-mat/0501001v3", "cond-mat/0501001v3"],
  ])("accepts %s", (input, normal) => {
    expect(parseArxivId(input)).toBe(normal);
  });

  it.each([
    ["1501.0001", "four digits after 2014"],
    ["1412.00001", "five digits before 2015"],
    ["0713.0001", "month 13"],
    ["0612.0001", "the new scheme starts in April 2007"],
    ["0706.0001v0", "versions start at 1"],
    ["hep-th/9913001", "month 13 in the old scheme"],
    ["HEP-TH/9901001", "archive names are lower case"],
    ["math.gt/0309136", "subject classes are upper case"],
    ["10.1000/182", "a DOI is not an arXiv identifier"],
  ])("refuses %s (%s)", (input) => {
    expect(parseArxivId(input)).toBeNull();
  });
});

describe("a published-in reference", () => {
  it("is a DOI or an arXiv identifier, and nothing else", () => {
    expect(parseReference("10.1103/PhysRevE.73.026203")).toEqual({ scheme: "doi", id: "10.1103/physreve.73.026203" });
    expect(parseReference("arXiv:1501.00001")).toEqual({ scheme: "arxiv", id: "1501.00001" });
    expect(parseReference("Israeli and Goldenfeld 2006")).toBeNull();
    expect(parseReference("")).toBeNull();
  });
});
