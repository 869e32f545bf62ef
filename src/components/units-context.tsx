import { createContext, type ReactNode, useContext, useMemo, useState } from 'react'

/** Display units the user picks (UI state only; everything below the components is SI). */
export interface DisplayUnits {
  pressure: 'bar' | 'psi' | 'kPa'
  temperature: 'degC' | 'degF'
}
const DEFAULT: DisplayUnits = { pressure: 'bar', temperature: 'degC' }
const Ctx = createContext<{ units: DisplayUnits; setUnits: (u: DisplayUnits) => void }>({ units: DEFAULT, setUnits: () => {} })

function load(): DisplayUnits {
  try {
    const raw = localStorage.getItem('fillwright.units')
    if (raw) return { ...DEFAULT, ...(JSON.parse(raw) as Partial<DisplayUnits>) }
  } catch {
    /* storage unavailable: defaults */
  }
  return DEFAULT
}

export function UnitsProvider({ children }: { children: ReactNode }) {
  const [units, setUnitsState] = useState<DisplayUnits>(load)
  const value = useMemo(
    () => ({
      units,
      setUnits: (u: DisplayUnits) => {
        setUnitsState(u)
        try {
          localStorage.setItem('fillwright.units', JSON.stringify(u))
        } catch {
          /* ignore */
        }
      },
    }),
    [units],
  )
  return <Ctx.Provider value={value}>{children}</Ctx.Provider>
}

export function useDisplayUnits() {
  return useContext(Ctx)
}
