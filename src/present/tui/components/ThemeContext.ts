/** The colour theme for every component (plain under NO_COLOR). */
import { createContext } from "react";
import { COLOUR_THEME, type Theme } from "../theme.js";

/** Context carrying the {@link Theme}; the screen provides it. */
export const ThemeContext = createContext<Theme>(COLOUR_THEME);
