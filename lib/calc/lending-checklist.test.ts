import { describe, expect, it } from "vitest";
import { DEFAULT_LENDING_CHECKLIST } from "./lending-checklist";

describe("DEFAULT_LENDING_CHECKLIST", () => {
  it("covers the usual high-voltage RF demonstration cautions once each, without promising safety", () => {
    const ids = DEFAULT_LENDING_CHECKLIST.map((i) => i.id);
    expect(new Set(ids).size).toBe(ids.length);
    const text = DEFAULT_LENDING_CHECKLIST.map((i) => i.text).join("\n");
    // docs/references.md, Safety section: clear zone and one operator, discharge wand, implanted devices, isolated supply,
    // X-rays from evacuated glass (West et al. 2017), ozone (OSHA), fire, RF contact burns (ICNIRP 2010), local codes.
    for (const pattern of [/one named operator/, /discharge wand/, /implanted medical device/, /isolated/, /X-rays/, /ozone/, /extinguisher/, /burns/, /local electrical and fire codes/]) {
      expect(text).toMatch(pattern);
    }
    expect(text).not.toMatch(/\bsafe\b/i);
  });
});
