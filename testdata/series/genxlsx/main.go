// Command genxlsx writes the workbooks under testdata/series that test
// the .xlsx reader (dataio.ReadXLSX). They are written by
// github.com/xuri/excelize/v2 (the version in go.mod), so they check
// galley's own reader (dataio/ooxml.go) on workbooks another library
// wrote: the decoding, the cells (types, date formats, serials) and the
// table rules; dataio/xlsx_handmade_test.go builds workbooks by hand,
// without excelize, for the parts these files do not reach.
// The values are an invented scenario: a made-up economy whose output
// grows by 1.5 a quarter from 100, and whose rate is 2 + i/10.
//
//	go run ./testdata/series/genxlsx
package main

import (
	"fmt"
	"log"
	"path/filepath"
	"time"

	"github.com/xuri/excelize/v2"
)

func main() {
	dir := filepath.Join("testdata", "series")
	write(filepath.Join(dir, "quarterly.xlsx"), quarterly)
	write(filepath.Join(dir, "serial_monthly.xlsx"), serialMonthly)
	write(filepath.Join(dir, "serial_daily.xlsx"), serialDaily)
	write(filepath.Join(dir, "quarter_end.xlsx"), quarterEnd)
	write(filepath.Join(dir, "plain_serial.xlsx"), plainSerial)
	write(filepath.Join(dir, "bad_text.xlsx"), badText)
}

func write(path string, fill func(*excelize.File) error) {
	f := excelize.NewFile()
	if err := fill(f); err != nil {
		log.Fatalf("%s: %v", path, err)
	}
	if err := f.SaveAs(path); err != nil {
		log.Fatal(err)
	}
	fmt.Println("wrote", path)
}

func set(f *excelize.File, sheet, cell string, v any) {
	if err := f.SetCellValue(sheet, cell, v); err != nil {
		log.Fatal(err)
	}
}

// quarterly: text dates 2001Q1…2003Q4 on sheet "Data" (second sheet),
// a missing rate in 2002Q2 (row 7), a #N/A-free layout.
func quarterly(f *excelize.File) error {
	if err := f.SetSheetName("Sheet1", "Notes"); err != nil {
		return err
	}
	set(f, "Notes", "A1", "invented data")
	if _, err := f.NewSheet("Data"); err != nil {
		return err
	}
	set(f, "Data", "A1", "date")
	set(f, "Data", "B1", "output")
	set(f, "Data", "C1", "rate")
	for i := 0; i < 12; i++ {
		row := i + 2
		set(f, "Data", fmt.Sprintf("A%d", row), fmt.Sprintf("%dQ%d", 2001+i/4, i%4+1))
		set(f, "Data", fmt.Sprintf("B%d", row), 100+1.5*float64(i))
		if row != 7 {
			set(f, "Data", fmt.Sprintf("C%d", row), 2+float64(i)/10)
		}
	}
	return nil
}

// serialMonthly: real date cells, first of each month 2010-01…2011-06,
// shown with the custom format "mmm yyyy".
func serialMonthly(f *excelize.File) error {
	code := "mmm yyyy"
	st, err := f.NewStyle(&excelize.Style{CustomNumFmt: &code})
	if err != nil {
		return err
	}
	set(f, "Sheet1", "A1", "Period")
	set(f, "Sheet1", "B1", "output")
	for i := 0; i < 18; i++ {
		row := i + 2
		cell := fmt.Sprintf("A%d", row)
		set(f, "Sheet1", cell, time.Date(2010, time.Month(1+i), 1, 0, 0, 0, 0, time.UTC))
		if err := f.SetCellStyle("Sheet1", cell, cell, st); err != nil {
			return err
		}
		set(f, "Sheet1", fmt.Sprintf("B%d", row), 100+1.5*float64(i))
	}
	return nil
}

// serialDaily: business days from Monday 2020-03-02 for two weeks,
// built-in format 14.
func serialDaily(f *excelize.File) error {
	st, err := f.NewStyle(&excelize.Style{NumFmt: 14})
	if err != nil {
		return err
	}
	set(f, "Sheet1", "A1", "date")
	set(f, "Sheet1", "B1", "price")
	row := 2
	for d := time.Date(2020, 3, 2, 0, 0, 0, 0, time.UTC); d.Before(time.Date(2020, 3, 14, 0, 0, 0, 0, time.UTC)); d = d.AddDate(0, 0, 1) {
		if d.Weekday() == time.Saturday || d.Weekday() == time.Sunday {
			continue
		}
		cell := fmt.Sprintf("A%d", row)
		set(f, "Sheet1", cell, d)
		if err := f.SetCellStyle("Sheet1", cell, cell, st); err != nil {
			return err
		}
		set(f, "Sheet1", fmt.Sprintf("B%d", row), 50+float64(row))
		row++
	}
	return nil
}

// quarterEnd: last days of quarters 1999Q3…2000Q4 as date cells.
func quarterEnd(f *excelize.File) error {
	code := "yyyy-mm-dd"
	st, err := f.NewStyle(&excelize.Style{CustomNumFmt: &code})
	if err != nil {
		return err
	}
	set(f, "Sheet1", "A1", "date")
	set(f, "Sheet1", "B1", "x")
	ends := []string{"1999-09-30", "1999-12-31", "2000-03-31", "2000-06-30", "2000-09-30", "2000-12-31"}
	for i, s := range ends {
		d, _ := time.Parse("2006-01-02", s)
		cell := fmt.Sprintf("A%d", i+2)
		set(f, "Sheet1", cell, d)
		if err := f.SetCellStyle("Sheet1", cell, cell, st); err != nil {
			return err
		}
		set(f, "Sheet1", fmt.Sprintf("B%d", i+2), i+1)
	}
	return nil
}

// plainSerial: date numbers without a date format in a column named
// "date": 36526 = 2000-01-01 … (1900 date system), yearly.
func plainSerial(f *excelize.File) error {
	set(f, "Sheet1", "A1", "date")
	set(f, "Sheet1", "B1", "x")
	for i, v := range []int{36526, 36892, 37257} { // 2000-01-01, 2001-01-01, 2002-01-01
		set(f, "Sheet1", fmt.Sprintf("A%d", i+2), v)
		set(f, "Sheet1", fmt.Sprintf("B%d", i+2), float64(i)+0.5)
	}
	return nil
}

// badText: text "n/a?" in C5.
func badText(f *excelize.File) error {
	set(f, "Sheet1", "A1", "date")
	set(f, "Sheet1", "B1", "output")
	set(f, "Sheet1", "C1", "rate")
	for i := 0; i < 6; i++ {
		row := i + 2
		set(f, "Sheet1", fmt.Sprintf("A%d", row), fmt.Sprintf("%d", 1980+i))
		set(f, "Sheet1", fmt.Sprintf("B%d", row), 10+i)
		if row == 5 {
			set(f, "Sheet1", fmt.Sprintf("C%d", row), "n/a?")
		} else {
			set(f, "Sheet1", fmt.Sprintf("C%d", row), 1+i)
		}
	}
	return nil
}
