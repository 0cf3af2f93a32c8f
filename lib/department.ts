// The invented department the demo runs as. A real deployment edits these lines.
export const DEPARTMENT = {
  city: "City of Larkspur Falls",
  division: "Building Safety Division",
  address: "400 Millrace Avenue, Larkspur Falls",
  phone: "(555) 014-2700",
  numberPrefix: "LFB",
  codeEditions: "2021 IBC with Larkspur Falls amendments; ASCE 7-16; NDS 2018; AISC 360-16; ACI 318-19",
} as const;
